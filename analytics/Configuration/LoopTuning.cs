namespace LoopWatch.Analytics.Configuration;

/// <summary>Known controller tuning; every field may be absent. Kc is derived from the proportional band when only that is given.</summary>
public sealed record LoopTuning(double? Kc, double? TiSeconds, double? TdSeconds, double? DeadTimeSeconds)
{
    /// <summary>No tuning known.</summary>
    public static LoopTuning None { get; } = new(null, null, null, null);

    /// <summary>Process time constant in seconds (first order plus dead time), when known.</summary>
    public double? TimeConstantSeconds { get; init; }

    /// <summary>Proportional band in %, 100 / Kc (trade definition).</summary>
    public double? PbPct => Kc is { } k && k != 0 ? 100.0 / k : null;
}

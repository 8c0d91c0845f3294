namespace LoopWatch.Analytics.Configuration;

/// <summary>Controller tuning as known from the control system; optional, used by the oscillation and advice code.</summary>
public sealed class TuningOptions
{
    /// <summary>Controller gain (dimensionless, % output per % of PV span).</summary>
    public double? Kc { get; set; }

    /// <summary>Proportional band in %; PB = 100 / Kc.</summary>
    public double? PbPct { get; set; }

    public double? TiSeconds { get; set; }
    public double? TdSeconds { get; set; }

    /// <summary>Process dead time, seconds; enables the performance index and, with the time constant, the ultimate gain of the offset advice.</summary>
    public double? DeadTimeSeconds { get; set; }

    /// <summary>Process time constant (first order plus dead time), seconds; with the dead time gives the gain at which the loop would oscillate.</summary>
    public double? TimeConstantSeconds { get; set; }
}

namespace LoopWatch.Agent.Configuration;

/// <summary>
/// When a final element is due for service. The defaults (2,000,000 reversals or 50,000 full strokes of travel) are
/// placeholders of our own, not from a source: set them from the valve and packing maker's data.
/// </summary>
public sealed class ValveOptions
{
    public long ServiceAfterReversals { get; set; } = 2_000_000;
    public double ServiceAfterStrokes { get; set; } = 50_000;

    /// <summary>How often the counters are saved, seconds (what a crash can lose).</summary>
    public double SaveEverySeconds { get; set; } = 60;
}

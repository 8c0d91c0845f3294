namespace LoopWatch.Analytics.Performance;

/// <summary>
/// Settings of the performance index. Defaults (our choice): AR order 15, a routine-operation window of 30 min
/// (in auto, no set-point move beyond 0.5 % of span), refitted every 5 min of event time.
/// </summary>
public sealed record PerformanceOptions
{
    /// <summary>Order p of the AR model of the control error.</summary>
    public int Order { get; init; } = 15;

    /// <summary>Length of the routine-operation window, seconds.</summary>
    public double WindowSeconds { get; init; } = 1800;

    /// <summary>Event time between two fits, seconds.</summary>
    public double EverySeconds { get; init; } = 300;

    /// <summary>A set-point change larger than this (% of span) restarts the window: routine operation has none.</summary>
    public double SpMovePct { get; init; } = 0.5;
}

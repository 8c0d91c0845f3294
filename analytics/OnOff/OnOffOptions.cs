namespace LoopWatch.Analytics.OnOff;

/// <summary>
/// Settings of the on-off cycle figures. Defaults: an output of 50 % or more is on (a 0/1 flag reads 1 as on);
/// figures over the last 6 complete cycles, trend against the 6 before; short-cycling needs 3 complete cycles and
/// ends below 90 % of the limit; 32 cycles of history.
/// </summary>
public sealed record OnOffOptions
{
    /// <summary>Output (%) at or above which the final element is on.</summary>
    public double OnThresholdPct { get; init; } = 50;

    /// <summary>Complete cycles the figures average over.</summary>
    public int RecentCycles { get; init; } = 6;

    /// <summary>Complete cycles needed before short-cycling may be raised.</summary>
    public int MinCycles { get; init; } = 3;

    /// <summary>The finding ends when starts per hour fall below this fraction of the limit (hysteresis against chatter).</summary>
    public double ClearFraction { get; init; } = 0.9;

    /// <summary>Complete cycles kept; must be at least twice <see cref="RecentCycles"/> for the trend.</summary>
    public int HistoryCycles { get; init; } = 32;
}

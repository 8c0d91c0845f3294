namespace LoopWatch.Analytics.Offset;

/// <summary>
/// Settings of the sustained-offset detector; times left null follow Limits:OffsetMinSeconds. Defaults (our choice,
/// common practice, no source): error smoothed over OffsetMin/10; settle OffsetMin/2 after a set-point move of more than
/// 0.5 % of span; ends after OffsetMin/5 within 80 % of the limit; saturated when OP at or beyond 1 / 99 % more than half
/// of the time; steady when the error's standard deviation is at most half its mean; figures updated at most every 60 s.
/// </summary>
public sealed record OffsetOptions
{
    /// <summary>Time constant of the smoothed error that is compared with the limit and reported, seconds (default OffsetMinSeconds / 10).</summary>
    public double? FilterSeconds { get; init; }

    /// <summary>Hold-off after a set-point move before an offset may start, seconds (default OffsetMinSeconds / 2).</summary>
    public double? SettleSeconds { get; init; }

    /// <summary>A set-point change larger than this (% of span) from where it last settled is a move (default 0.5).</summary>
    public double SpMovePct { get; init; } = 0.5;

    /// <summary>The finding ends when the smoothed error is within (1 - this) of the limit (default 0.2).</summary>
    public double Hysteresis { get; init; } = 0.2;

    /// <summary>How long the error must stay back within the band before the finding ends, seconds (default OffsetMinSeconds / 5).</summary>
    public double? EndSeconds { get; init; }

    /// <summary>Output at or above this (%) counts as saturated high (default 99).</summary>
    public double SaturatedHighPct { get; init; } = 99;

    /// <summary>Output at or below this (%) counts as saturated low (default 1).</summary>
    public double SaturatedLowPct { get; init; } = 1;

    /// <summary>Share of the offset's time at a limit above which the cause is saturation (default 0.5, "most of the time").</summary>
    public double SaturatedShare { get; init; } = 0.5;

    /// <summary>The error is steady when its standard deviation is at most this times its mean (default 0.5).</summary>
    public double SteadyRatio { get; init; } = 0.5;

    /// <summary>Least time between two figure updates of an active finding, seconds (default 60).</summary>
    public double UpdateEverySeconds { get; init; } = 60;
}

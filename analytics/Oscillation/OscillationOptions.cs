using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// Settings of the oscillation detector. Defaults: a window of 1024 (decimated) samples evaluated every 256; decimation
/// chosen so the window spans 10 ultimate periods; Hagglund's T_sup = 50 T_u and n_lim = 10 (Hagglund 1995);
/// regularity limit 1 (Thornhill et al. 2003); our own guards: ACF peak at one period at least 0.3 and at least 8 samples
/// a period; the finding ends after 10 periods without evidence; Horch phase at least 60 degrees odd, at most 30 even.
/// </summary>
public sealed record OscillationOptions
{
    /// <summary>Samples in the analysis window after decimation (default 1024; at 1 s and float storage 4 KB per signal).</summary>
    public int WindowSamples { get; init; } = 1024;

    /// <summary>The ACF is evaluated after this many new window samples (default 256), which amortises its cost.</summary>
    public int EvaluateEverySamples { get; init; } = 256;

    /// <summary>Raw samples averaged into one window sample; null (default) picks it so the window spans <see cref="WindowPeriods"/> T_u.</summary>
    public int? Decimation { get; init; }

    /// <summary>Ultimate periods the window should span when the decimation is automatic (default 10: enough ACF crossings for the regularity).</summary>
    public double WindowPeriods { get; init; } = 10;

    /// <summary>Hagglund's supervision time in ultimate periods, T_sup = 50 T_u (Hagglund 1995).</summary>
    public double SupervisionPeriods { get; init; } = 50;

    /// <summary>Hagglund's n_lim: more load detections than this in T_sup is an oscillation (default 10, Hagglund 1995).</summary>
    public double LoadLimitCount { get; init; } = 10;

    /// <summary>Thornhill's regularity limit: r above it is a regular oscillation (default 1, Thornhill et al. 2003).</summary>
    public double RegularityLimit { get; init; } = 1;

    /// <summary>ACF zero crossings used for the regularity (default 11, giving 9 periods T_p,i).</summary>
    public int ZeroCrossings { get; init; } = 11;

    /// <summary>Our guard against noise: the ACF near one period must reach at least this (default 0.3).</summary>
    public double MinAcfPeak { get; init; } = 0.3;

    /// <summary>Our guard against noise: fewer samples a period than this is not taken as an oscillation (default 8).</summary>
    public double MinPeriodSamples { get; init; } = 8;

    /// <summary>The finding ends after this many periods with neither method seeing an oscillation (default 10, our choice).</summary>
    public double EndAfterPeriods { get; init; } = 10;

    /// <summary>Horch phase (degrees) at or above which the cross-correlation counts as odd (default 60; our split of 0-90 in thirds).</summary>
    public double OddPhaseDegrees { get; init; } = 60;

    /// <summary>Horch phase (degrees) at or below which the cross-correlation counts as even (default 30).</summary>
    public double EvenPhaseDegrees { get; init; } = 30;

    /// <summary>Ultimate period T_u in seconds when known; null (default) takes Tuning:TiSeconds, then the observed period, then <see cref="DefaultUltimatePeriodS"/>.</summary>
    public double? UltimatePeriodS { get; init; }

    /// <summary>
    /// T_u to assume with neither tuning nor an observed period, by process kind: flow 10 s, pressure 20 s, level and
    /// temperature 600 s, other 60 s (typical ranges of those loops; common practice, no source).
    /// </summary>
    public static double DefaultUltimatePeriodS(ProcessKind process) => process switch
    {
        ProcessKind.Flow => 10,
        ProcessKind.Pressure => 20,
        ProcessKind.Level => 600,
        ProcessKind.Temperature => 600,
        _ => 60,
    };
}

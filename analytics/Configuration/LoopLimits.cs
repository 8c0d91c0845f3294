namespace LoopWatch.Analytics.Configuration;

/// <summary>The thresholds of one loop after defaults by process kind are applied; see <see cref="LimitDefaults"/>.</summary>
public sealed record LoopLimits(
    double OffsetPct,
    double OffsetMinSeconds,
    double MaxStartsPerHour,
    double MaxReversalsPerHour,
    double ReversalDeadbandPct,
    double OscillationAmplitudePct,
    double StaleSeconds,
    double SampleSeconds);

namespace LoopWatch.Analytics.Configuration;

/// <summary>
/// Default thresholds by process kind. Values are common practice as remembered by the team, not from one source:
/// offset flow 2 %, pressure 1 %, level 5 % (levels are often run loosely on purpose), temperature 1 %, other 2 %;
/// offset duration flow/pressure 5 min, level/temperature 30 min, other 15 min;
/// starts per hour level and flow 10 (pump motors, 6-15 commonly quoted), pressure 10 (compressors), temperature 30
/// (contactor-switched heaters), other 12; reversals per hour flow/pressure 200, level/temperature 60, other 120;
/// reversal deadband 0.5 % of stroke; oscillation limit 1 % of span (Hagglund 1995); stale after 30 s; 1 s sampling.
/// </summary>
public static class LimitDefaults
{
    /// <summary>The defaults for a process kind.</summary>
    public static LoopLimits For(ProcessKind process) => process switch
    {
        ProcessKind.Flow => new(2.0, 300, 10, 200, 0.5, 1.0, 30, 1),
        ProcessKind.Pressure => new(1.0, 300, 10, 200, 0.5, 1.0, 30, 1),
        ProcessKind.Level => new(5.0, 1800, 10, 60, 0.5, 1.0, 30, 1),
        ProcessKind.Temperature => new(1.0, 1800, 30, 60, 0.5, 1.0, 30, 1),
        _ => new(2.0, 900, 12, 120, 0.5, 1.0, 30, 1),
    };

    /// <summary>The defaults for <paramref name="process"/> overridden by whatever <paramref name="given"/> sets.</summary>
    public static LoopLimits Resolve(ProcessKind process, LimitOptions? given)
    {
        var d = For(process);
        if (given is null) return d;
        return new LoopLimits(
            given.OffsetPct ?? d.OffsetPct,
            given.OffsetMinSeconds ?? d.OffsetMinSeconds,
            given.MaxStartsPerHour ?? d.MaxStartsPerHour,
            given.MaxReversalsPerHour ?? d.MaxReversalsPerHour,
            given.ReversalDeadbandPct ?? d.ReversalDeadbandPct,
            given.OscillationAmplitudePct ?? d.OscillationAmplitudePct,
            given.StaleSeconds ?? d.StaleSeconds,
            given.SampleSeconds ?? d.SampleSeconds);
    }
}

using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Configuration;

/// <summary>
/// Alarm defaults by process kind, as commonly cited from ISA-18.2 / EEMUA 191 guidance (from memory, no single
/// table quoted): deadband flow 5 %, level 5 %, pressure 2 %, temperature 1 %, other 2 %; on- and off-delay
/// flow 15 s, level 60 s, pressure 15 s, temperature 60 s, other 30 s. Priorities: stale and frozen high;
/// short-cycling, excessive-reversals and out-of-range medium; oscillation, sustained-offset and saturation low.
/// </summary>
public static class AlarmDefaults
{
    /// <summary>The defaults for a process kind.</summary>
    public static LoopAlarmLimits For(ProcessKind process) => process switch
    {
        ProcessKind.Flow => Make(5, 15),
        ProcessKind.Level => Make(5, 60),
        ProcessKind.Pressure => Make(2, 15),
        ProcessKind.Temperature => Make(1, 60),
        _ => Make(2, 30),
    };

    /// <summary>The default priority of an alarm on finding <paramref name="kind"/>.</summary>
    public static AlarmPriority Priority(string kind) => kind switch
    {
        FindingKinds.Stale or FindingKinds.Frozen => AlarmPriority.High,
        FindingKinds.ShortCycling or FindingKinds.ExcessiveReversals or FindingKinds.OutOfRange => AlarmPriority.Medium,
        _ => AlarmPriority.Low,
    };

    private static LoopAlarmLimits Make(double deadbandPct, double delaySeconds) =>
        new(deadbandPct, delaySeconds, delaySeconds, new Dictionary<string, AlarmPriority>(), [], "UTC");
}

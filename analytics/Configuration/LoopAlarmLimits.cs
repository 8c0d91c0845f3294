namespace LoopWatch.Analytics.Configuration;

/// <summary>A loop's alarm settings after defaults by process kind are applied; see <see cref="AlarmDefaults"/>.</summary>
public sealed record LoopAlarmLimits(
    double DeadbandPct,
    double OnDelaySeconds,
    double OffDelaySeconds,
    IReadOnlyDictionary<string, AlarmPriority> Priorities,
    IReadOnlyList<AlarmWindow> ActiveWhen,
    string TimeZone)
{
    /// <summary>The priority of an alarm on finding <paramref name="kind"/>.</summary>
    public AlarmPriority PriorityOf(string kind) =>
        Priorities.TryGetValue(kind, out var p) ? p : AlarmDefaults.Priority(kind);
}

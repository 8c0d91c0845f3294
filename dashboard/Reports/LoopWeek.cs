namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// One loop's week: hours with samples, healthy hours (no finding active in the hour), and the summed time
/// oscillating, with an offset, with any finding, stale and in manual (seconds) and valve reversals.
/// </summary>
public sealed record LoopWeek(
    string LoopId,
    string Area,
    int Hours,
    int HealthyHours,
    double SecondsOscillating,
    double SecondsOffset,
    long Reversals,
    double SecondsAnyFinding,
    double SecondsStale,
    double SecondsManual)
{
    /// <summary>Healthy hours as a percentage of hours with samples; null without data.</summary>
    public double? HealthyPct => Hours == 0 ? null : 100.0 * HealthyHours / Hours;
}

using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// The week's loop health from stored hourly statistics: a loop-hour counts when it has samples and is healthy when
/// <c>seconds_any_finding</c> is 0; per area and per loop, the ten worst loops by time oscillating, time with an offset
/// and valve reversals, and the alarm rate.
/// </summary>
public sealed record WeeklySummary(
    ReportWeek Week,
    int LoopsMonitored,
    int Hours,
    int HealthyHours,
    IReadOnlyList<AreaWeek> Areas,
    IReadOnlyList<LoopWeek> Loops,
    IReadOnlyList<LoopWeek> TopOscillating,
    IReadOnlyList<LoopWeek> TopOffset,
    IReadOnlyList<LoopWeek> TopReversals,
    AlarmRate Alarms)
{
    /// <summary>The area of a loop the plant no longer lists.</summary>
    public const string UnknownArea = "(not configured)";

    /// <summary>How many loops each top list holds.</summary>
    public const int TopCount = 10;

    /// <summary>Healthy loop-hours as a percentage of loop-hours with samples; null without data.</summary>
    public double? HealthyPct => Hours == 0 ? null : 100.0 * HealthyHours / Hours;

    /// <summary>
    /// The summary of <paramref name="week"/>: <paramref name="hourly"/> rows outside the week are ignored, loops in
    /// <paramref name="areas"/> (loop id to area, in plant order) without data are listed with zero hours.
    /// </summary>
    public static WeeklySummary Compute(ReportWeek week, IEnumerable<HourlyStatsRow> hourly, IReadOnlyList<KeyValuePair<string, string>> areas,
        IEnumerable<AlarmJournalEntry> journal)
    {
        long from = week.Start.ToUnixTimeMilliseconds(), to = week.End.ToUnixTimeMilliseconds();
        var byLoop = hourly.Where(r => r.HourMs >= from && r.HourMs < to && r.Samples > 0)
            .GroupBy(r => r.LoopId).ToDictionary(g => g.Key, g => g.ToList(), StringComparer.Ordinal);
        var area = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (id, a) in areas) area.TryAdd(id, a);
        var ids = areas.Select(a => a.Key).Distinct(StringComparer.Ordinal)
            .Concat(byLoop.Keys.Where(k => !area.ContainsKey(k)).Order(StringComparer.Ordinal));
        var loops = ids.Select(id => Loop(id, area.GetValueOrDefault(id, UnknownArea), byLoop.GetValueOrDefault(id) ?? [])).ToList();

        var areaWeeks = loops.GroupBy(l => l.Area)
            .Select(g => new AreaWeek(g.Key, g.Count(l => l.Hours > 0), g.Sum(l => l.Hours), g.Sum(l => l.HealthyHours)))
            .OrderBy(a => a.Area, StringComparer.Ordinal).ToList();
        return new WeeklySummary(week, loops.Count(l => l.Hours > 0), loops.Sum(l => l.Hours), loops.Sum(l => l.HealthyHours),
            areaWeeks, loops,
            Top(loops, l => l.SecondsOscillating), Top(loops, l => l.SecondsOffset), Top(loops, l => l.Reversals),
            AlarmRate.Compute(journal, from, to));
    }

    private static LoopWeek Loop(string id, string area, List<HourlyStatsRow> rows) => new(
        id, area, rows.Count, rows.Count(r => (r.SecondsAnyFinding ?? 0) == 0),
        rows.Sum(r => r.SecondsOscillating ?? 0), rows.Sum(r => r.SecondsOffset ?? 0), rows.Sum(r => r.Reversals ?? 0),
        rows.Sum(r => r.SecondsAnyFinding ?? 0), rows.Sum(r => r.SecondsStale ?? 0), rows.Sum(r => r.SecondsManual ?? 0));

    // Only loops that have some of it; ties by loop id so the list is stable.
    private static List<LoopWeek> Top(List<LoopWeek> loops, Func<LoopWeek, double> by) =>
        loops.Where(l => by(l) > 0).OrderByDescending(by).ThenBy(l => l.LoopId, StringComparer.Ordinal).Take(TopCount).ToList();
}

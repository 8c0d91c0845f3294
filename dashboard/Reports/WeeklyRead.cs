using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// Reads a week's hourly statistics and alarm journal from one agent's database or from several (agents sharing a
/// plant by shard) and computes one <see cref="WeeklySummary"/>; a loop-hour stored by two agents counts once.
/// </summary>
public static class WeeklyRead
{
    /// <summary>The summary of <paramref name="week"/> over every database in <paramref name="readers"/>.</summary>
    public static async Task<WeeklySummary> SummaryAsync(IEnumerable<StorageReader> readers, ReportWeek week,
        IReadOnlyList<KeyValuePair<string, string>> areas, CancellationToken ct = default)
    {
        long from = week.Start.ToUnixTimeMilliseconds(), to = week.End.ToUnixTimeMilliseconds();
        // Keyed by loop and hour: after a loop moves between shards, the hour of the move may be in both databases.
        var hourly = new Dictionary<(string, long), HourlyStatsRow>();
        var journal = new List<AlarmJournalEntry>();
        foreach (var reader in readers)
        {
            foreach (var row in await reader.ReadHourlyStatsAsync(from, to, ct))
                if (!hourly.TryGetValue((row.LoopId, row.HourMs), out var seen) || row.Samples > seen.Samples) hourly[(row.LoopId, row.HourMs)] = row;
            journal.AddRange(await reader.ReadJournalAsync(new JournalQuery(from, to, Limit: 1_000_000, OldestFirst: true), ct));
        }
        return WeeklySummary.Compute(week, hourly.Values, areas, journal);
    }
}

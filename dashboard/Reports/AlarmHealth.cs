using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// Alarm-system figures computed from journal rows alone, so they can be checked on a constructed journal. An
/// activation is a transition into <c>unacknowledged</c>. Benchmarks (EEMUA 191, from memory): about 1 alarm per
/// 10 minutes is acceptable, about 2 manageable, more than 10 in any 10 minutes is a flood. Chattering: 3 or more
/// activations of one alarm within 60 s (common practice, no source).
/// </summary>
public static class AlarmHealth
{
    /// <summary>10 minutes in ms, the EEMUA 191 rate window.</summary>
    public const long TenMinutesMs = 600_000;

    /// <summary>Activations of one alarm in this many ms that make it chattering.</summary>
    public const long ChatterWindowMs = 60_000;

    /// <summary>Activations within <see cref="ChatterWindowMs"/> that make an alarm chattering.</summary>
    public const int ChatterCount = 3;

    /// <summary>More than this many activations in 10 minutes is a flood.</summary>
    public const int FloodPerTenMinutes = 10;

    /// <summary>The figures of <paramref name="journal"/> rows with time in [<paramref name="fromMs"/>, <paramref name="toMs"/>).</summary>
    public static AlarmHealthReport Compute(IEnumerable<AlarmJournalEntry> journal, long fromMs, long toMs)
    {
        var activations = journal
            .Where(e => e.ToState == "unacknowledged" && e.TimeMs >= fromMs && e.TimeMs < toMs)
            .OrderBy(e => e.TimeMs).ToList();
        var spanMs = Math.Max(1, toMs - fromMs);
        var perTen = activations.Count * (double)TenMinutesMs / spanMs;

        // Busiest window and flood windows over consecutive 10-minute blocks from the start of the period.
        var blocks = activations.GroupBy(e => (e.TimeMs - fromMs) / TenMinutesMs).Select(g => g.Count()).ToList();
        var peak = SlidingPeak(activations.Select(e => e.TimeMs).ToList(), TenMinutesMs);
        var floods = blocks.Count(c => c > FloodPerTenMinutes);

        var byAlarm = activations.GroupBy(e => (e.LoopId, e.Kind)).ToList();
        var chattering = byAlarm
            .Where(g => SlidingPeak(g.Select(e => e.TimeMs).ToList(), ChatterWindowMs) >= ChatterCount)
            .Select(g => Count(g.Key, g.Count())).OrderByDescending(c => c.Activations).ThenBy(c => c.Id, StringComparer.Ordinal).ToList();
        var top = byAlarm.Select(g => Count(g.Key, g.Count()))
            .OrderByDescending(c => c.Activations).ThenBy(c => c.Id, StringComparer.Ordinal).Take(10).ToList();

        var rating = peak > FloodPerTenMinutes ? "flood"
            : perTen <= 1 ? "acceptable"
            : perTen <= 2 ? "manageable"
            : "overloaded";
        return new AlarmHealthReport(DateTimeOffset.FromUnixTimeMilliseconds(fromMs), DateTimeOffset.FromUnixTimeMilliseconds(toMs),
            activations.Count, perTen, peak, floods, rating, chattering, top);
    }

    // Most events in any window of the given length (times sorted ascending).
    private static int SlidingPeak(List<long> times, long windowMs)
    {
        var best = 0;
        for (int lo = 0, hi = 0; hi < times.Count; hi++)
        {
            while (times[hi] - times[lo] >= windowMs) lo++;
            best = Math.Max(best, hi - lo + 1);
        }
        return best;
    }

    private static AlarmCount Count((string LoopId, string Kind) key, int n) => new($"{key.LoopId}:{key.Kind}", key.LoopId, key.Kind, n);
}

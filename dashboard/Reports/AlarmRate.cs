using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// The alarm rate of a period from the journal: activations (transitions into unacknowledged), the average per
/// 10 minutes and the busiest 10 minutes. EEMUA 191 benchmarks (from memory): about 1 per 10 minutes acceptable,
/// about 2 manageable, more than 10 in any 10 minutes is a flood.
/// </summary>
public sealed record AlarmRate(int Activations, double PerTenMinutes, int PeakTenMinutes, string Rating)
{
    /// <summary>The EEMUA 191 rate window in ms.</summary>
    public const long TenMinutesMs = 600_000;

    /// <summary>More than this many activations in 10 minutes is a flood (EEMUA 191).</summary>
    public const int FloodPerTenMinutes = 10;

    /// <summary>The rate of <paramref name="journal"/> rows with time in [<paramref name="fromMs"/>, <paramref name="toMs"/>).</summary>
    public static AlarmRate Compute(IEnumerable<AlarmJournalEntry> journal, long fromMs, long toMs)
    {
        var times = journal.Where(e => e.ToState == "unacknowledged" && e.TimeMs >= fromMs && e.TimeMs < toMs)
            .Select(e => e.TimeMs).Order().ToList();
        var perTen = times.Count * (double)TenMinutesMs / Math.Max(1, toMs - fromMs);
        var peak = 0;
        for (int lo = 0, hi = 0; hi < times.Count; hi++)
        {
            while (times[hi] - times[lo] >= TenMinutesMs) lo++;
            peak = Math.Max(peak, hi - lo + 1);
        }
        var rating = peak > FloodPerTenMinutes ? "flood" : perTen <= 1 ? "acceptable" : perTen <= 2 ? "manageable" : "overloaded";
        return new AlarmRate(times.Count, perTen, peak, rating);
    }
}

using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// The alarm rate of a period from the journal (activations, average per 10 minutes, busiest 10 minutes, rating):
/// the weekly summary's part of <see cref="AlarmHealth"/>.
/// </summary>
public sealed record AlarmRate(int Activations, double PerTenMinutes, int PeakTenMinutes, string Rating)
{
    /// <summary>The rate of <paramref name="journal"/> rows with time in [<paramref name="fromMs"/>, <paramref name="toMs"/>), by the rules of <see cref="AlarmHealth"/>.</summary>
    public static AlarmRate Compute(IEnumerable<AlarmJournalEntry> journal, long fromMs, long toMs)
    {
        var h = AlarmHealth.Compute(journal, fromMs, toMs);
        return new AlarmRate(h.Activations, h.PerTenMinutes, h.PeakTenMinutes, h.Rating);
    }
}

using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Tests.Reports;

public sealed class AlarmHealthTests
{
    private static AlarmJournalEntry Act(long ms, string loop, string kind = "oscillation") =>
        new(ms, loop, kind, "low", "normal", "unacknowledged");

    [Fact]
    public void Rate_figures_on_a_constructed_journal_with_a_known_count()
    {
        var journal = new List<AlarmJournalEntry>();
        // 6 hours, one activation every 10 minutes: exactly the EEMUA 191 "acceptable" average (about 1 per 10 min, from memory).
        for (var i = 0; i < 36; i++) journal.Add(Act(i * 600_000L + 1_000, $"FIC-{i % 4}"));
        journal.Add(new AlarmJournalEntry(5_000, "FIC-0", "oscillation", "low", "unacknowledged", "acknowledged", User: "op"));
        var r = AlarmHealth.Compute(journal, 0, 6 * 3_600_000L);
        Assert.Equal(36, r.Activations);
        Assert.Equal(1.0, r.PerTenMinutes, 9);
        Assert.Equal("acceptable", r.Rating);
        Assert.Equal(0, r.FloodWindows);
        Assert.Empty(r.Chattering);
        Assert.Equal(4, r.MostFrequent.Count);
        Assert.Equal(9, r.MostFrequent[0].Activations);
    }

    [Fact]
    public void Eleven_alarms_in_ten_minutes_are_a_flood_and_three_in_a_minute_chatter()
    {
        var journal = new List<AlarmJournalEntry>();
        for (var i = 0; i < 11; i++) journal.Add(Act(i * 50_000L, $"PIC-{i}", "excessive-reversals")); // 11 in 550 s
        journal.Add(Act(2_000_000, "LIC-1", "short-cycling"));
        journal.Add(Act(2_020_000, "LIC-1", "short-cycling"));
        journal.Add(Act(2_059_000, "LIC-1", "short-cycling")); // 3 within 59 s: chattering (common practice, no source)
        journal.Add(Act(2_500_000, "LIC-2", "short-cycling"));
        journal.Add(Act(2_561_000, "LIC-2", "short-cycling"));
        journal.Add(Act(2_622_000, "LIC-2", "short-cycling")); // 3 in 122 s: not chattering
        var r = AlarmHealth.Compute(journal, 0, 3_600_000);
        Assert.Equal(17, r.Activations);
        Assert.Equal(11, r.PeakTenMinutes);
        Assert.Equal(1, r.FloodWindows); // EEMUA 191 (from memory): more than 10 alarms in 10 minutes is a flood
        Assert.Equal("flood", r.Rating);
        Assert.Equal("LIC-1:short-cycling", Assert.Single(r.Chattering).Id);
        Assert.Equal(10, r.MostFrequent.Count);
        Assert.Equal(17.0 / 6, r.PerTenMinutes, 9);
    }
}

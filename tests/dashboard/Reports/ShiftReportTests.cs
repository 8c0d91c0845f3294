using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Tests.Reports;

public sealed class ShiftReportTests
{
    [Fact]
    public void A_shift_lists_raised_and_cleared_alarms_state_changes_and_comments()
    {
        var shift = ShiftSchedule.Default.At(DateTimeOffset.Parse("2026-03-02T10:00:00Z", System.Globalization.CultureInfo.InvariantCulture));
        var t0 = shift.Start.ToUnixTimeMilliseconds();
        AlarmJournalEntry[] journal =
        [
            new(t0 - 1, "FIC-101", "stale", "high", "normal", "unacknowledged"), // the shift before
            new(t0 + 10, "FIC-101", "stale", "high", "unacknowledged", "acknowledged", User: "op.one", Comment: "gateway restarted"),
            new(t0 + 20, "FIC-101", "stale", "high", "acknowledged", "normal"),
            new(t0 + 30, "PIC-201", "offset", "low", "normal", "unacknowledged"),
            new(t0 + 40, "PIC-201", "offset", "low", "unacknowledged", "returned-unacknowledged"),
            new(t0 + 50, "PIC-201", "offset", "low", "returned-unacknowledged", "unacknowledged"),
            new(t0 + 60, "TIC-202", "oscillation", "medium", "normal", "shelved", User: "op.one", Comment: "tuning review booked"),
            new(shift.End.ToUnixTimeMilliseconds(), "TIC-202", "oscillation", "medium", "shelved", "normal"), // the shift after
        ];
        var r = ShiftReport.Compute(journal, shift);

        // ISA-18.2 state names: an activation enters unacknowledged; the condition clearing leaves unacknowledged for
        // returned-unacknowledged or acknowledged for normal (the acknowledgement of a returned alarm is not a clear).
        Assert.Equal([("PIC-201", 30L), ("PIC-201", 50L)], r.Raised.Select(e => (e.LoopId, e.TimeMs - t0)));
        Assert.Equal([("FIC-101", 20L), ("PIC-201", 40L)], r.Cleared.Select(e => (e.LoopId, e.TimeMs - t0)));
        Assert.Equal(
            [new AlarmChange("FIC-101", "stale", "high", "unacknowledged", "normal", 2),
             new AlarmChange("PIC-201", "offset", "low", "normal", "unacknowledged", 3),
             new AlarmChange("TIC-202", "oscillation", "medium", "normal", "shelved", 1)],
            r.Changes);
        Assert.Equal(["gateway restarted", "tuning review booked"], r.Comments.Select(e => e.Comment));
    }
}

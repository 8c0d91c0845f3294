using LoopWatch.Storage.Rows;

namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// What happened in one shift, from the alarm journal alone: alarms raised (transitions into unacknowledged), alarms
/// cleared (condition gone: unacknowledged to returned-unacknowledged, acknowledged to normal), the alarms whose state
/// changed with their state at the start and end of the shift, and operator comments.
/// </summary>
public sealed record ShiftReport(
    ShiftWindow Shift,
    IReadOnlyList<AlarmJournalEntry> Raised,
    IReadOnlyList<AlarmJournalEntry> Cleared,
    IReadOnlyList<AlarmChange> Changes,
    IReadOnlyList<AlarmJournalEntry> Comments)
{
    /// <summary>The report of <paramref name="journal"/> rows that fall in <paramref name="shift"/>.</summary>
    public static ShiftReport Compute(IEnumerable<AlarmJournalEntry> journal, ShiftWindow shift)
    {
        var from = shift.Start.ToUnixTimeMilliseconds();
        var to = shift.End.ToUnixTimeMilliseconds();
        var rows = journal.Where(e => e.TimeMs >= from && e.TimeMs < to).OrderBy(e => e.TimeMs).ThenBy(e => e.Id).ToList();
        var raised = rows.Where(e => e.ToState == "unacknowledged").ToList();
        var cleared = rows.Where(e => (e.FromState, e.ToState) is ("unacknowledged", "returned-unacknowledged") or ("acknowledged", "normal")).ToList();
        var changes = rows.GroupBy(e => (e.LoopId, e.Kind))
            .Select(g => new AlarmChange(g.Key.LoopId, g.Key.Kind, g.Last().Priority, g.First().FromState, g.Last().ToState, g.Count()))
            .OrderBy(c => c.LoopId, StringComparer.Ordinal).ThenBy(c => c.Kind, StringComparer.Ordinal).ToList();
        var comments = rows.Where(e => !string.IsNullOrWhiteSpace(e.Comment)).ToList();
        return new ShiftReport(shift, raised, cleared, changes, comments);
    }
}

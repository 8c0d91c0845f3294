namespace LoopWatch.Storage.Rows;

/// <summary>
/// One alarm state transition, appended to the journal. <see cref="Id"/> is assigned by the database (ignored on write);
/// <see cref="FiguresJson"/> holds the finding's figures as JSON text.
/// </summary>
public readonly record struct AlarmJournalEntry(
    long TimeMs,
    string LoopId,
    string Kind,
    string Priority,
    string FromState,
    string ToState,
    string? FiguresJson = null,
    string? User = null,
    string? Comment = null,
    long Id = 0);

namespace LoopWatch.Storage.Rows;

/// <summary>Current alarm state of one (loop, finding kind), kept so active alarms and shelves survive a restart.</summary>
public readonly record struct AlarmStateRow(
    string LoopId,
    string Kind,
    string State,
    string Priority,
    long? RaisedMs,
    string? AckedBy,
    long? ShelvedUntilMs,
    string? ShelvedBy,
    string? Comment,
    long UpdatedMs);

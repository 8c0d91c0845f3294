namespace LoopWatch.Storage.Reading;

/// <summary>
/// Which journal rows to read: time from <see cref="FromMs"/> (inclusive) to <see cref="ToMs"/> (exclusive), optionally
/// one loop and one kind, at most <see cref="Limit"/> rows (default 1,000), newest first unless <see cref="OldestFirst"/>.
/// </summary>
public readonly record struct JournalQuery(
    long FromMs,
    long ToMs,
    string? LoopId = null,
    string? Kind = null,
    int Limit = 1_000,
    bool OldestFirst = false);

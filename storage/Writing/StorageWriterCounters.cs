namespace LoopWatch.Storage.Writing;

/// <summary>
/// A snapshot of the writer: commands accepted, committed, refused (queue full or writer closed), rejected by the
/// database for their values (e.g. a missing loop id), waiting (queue plus backlog), transactions committed and failed,
/// and the last error and batch duration.
/// </summary>
public readonly record struct StorageWriterCounters(
    long Queued,
    long Written,
    long Dropped,
    long Rejected,
    long Pending,
    long Backlog,
    long Batches,
    long Failed,
    string? LastError,
    TimeSpan LastBatchDuration);

namespace LoopWatch.Dashboard.Model;

/// <summary>
/// The database writer as the dashboard reports it: the fault while writes fail (null when fine) and since when, the
/// rows held waiting to be written, those refused because the bounded backlog was full, and those written.
/// </summary>
public readonly record struct StorageHealth(string? Fault, DateTimeOffset? FaultSince, long Pending, long Dropped, long Written);

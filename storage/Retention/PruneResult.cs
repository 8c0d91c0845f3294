namespace LoopWatch.Storage.Retention;

/// <summary>Rows removed by one prune, per table.</summary>
public readonly record struct PruneResult(long JournalRows, long HourlyRows);

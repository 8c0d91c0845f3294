using Dapper;

namespace LoopWatch.Storage.Retention;

/// <summary>
/// Removes alarm journal and hourly statistics rows older than the retention period, in small transactions so the
/// writer is never locked out for long. Alarm states, counters, service periods and records are kept.
/// </summary>
public sealed class RetentionPruner(LoopWatchDatabase database, TimeProvider? time = null)
{
    // Small chunks keep each write lock short; the writer waits at most one chunk.
    private const int ChunkRows = 5_000;

    private const string DeleteJournal = """
        DELETE FROM alarm_journal WHERE id IN (SELECT id FROM alarm_journal WHERE time_ms < @CutoffMs LIMIT @Chunk)
        """;

    private const string DeleteHourly = """
        DELETE FROM hourly_stats WHERE rowid IN (SELECT rowid FROM hourly_stats WHERE hour_ms < @CutoffMs LIMIT @Chunk)
        """;

    private readonly TimeProvider _time = time ?? TimeProvider.System;

    /// <summary>Removes rows older than <see cref="StorageOptions.RetentionDays"/> before now; call it e.g. once a day.</summary>
    public Task<PruneResult> PruneExpiredAsync(CancellationToken cancellationToken = default) =>
        PruneAsync(_time.GetUtcNow() - TimeSpan.FromDays(database.Options.RetentionDays), cancellationToken);

    /// <summary>Removes journal rows with time and hourly rows with hour start before <paramref name="olderThan"/>.</summary>
    public async Task<PruneResult> PruneAsync(DateTimeOffset olderThan, CancellationToken cancellationToken = default)
    {
        var cutoff = olderThan.ToUnixTimeMilliseconds();
        var journal = await DeleteInChunksAsync(DeleteJournal, cutoff, cancellationToken).ConfigureAwait(false);
        var hourly = await DeleteInChunksAsync(DeleteHourly, cutoff, cancellationToken).ConfigureAwait(false);
        return new PruneResult(journal, hourly);
    }

    private async Task<long> DeleteInChunksAsync(string sql, long cutoffMs, CancellationToken cancellationToken)
    {
        long total = 0;
        await using var connection = database.OpenConnection();
        while (true)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var deleted = await connection.ExecuteAsync(new CommandDefinition(
                sql, new { CutoffMs = cutoffMs, Chunk = ChunkRows }, cancellationToken: cancellationToken)).ConfigureAwait(false);
            total += deleted;
            if (deleted < ChunkRows) return total;
            await Task.Yield(); // let other work run between chunks
        }
    }
}

using Dapper;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Storage.Writing;

/// <summary>Commits a slice of queued commands in one transaction on the writer's own connection.</summary>
internal sealed class BatchCommitter(LoopWatchDatabase database, ILogger logger) : IDisposable
{
    // Keyed by reference: the statements are the WriteSql constants, so no row hashes a kilobyte of SQL text.
    private readonly Dictionary<string, PreparedStatement> _prepared = new(ReferenceEqualityComparer.Instance);
    private SqliteConnection? _connection;

    /// <summary>Message of the last row left out for its values, if any.</summary>
    public string? LastRejection { get; private set; }

    /// <summary>Commits <paramref name="count"/> commands from <paramref name="start"/>; returns how many rows were left out as bad.</summary>
    public int Commit(List<StorageCommand> commands, int start, int count)
    {
        var connection = _connection ??= database.OpenWriterConnection();
        try
        {
            CommitRuns(connection, commands, start, count);
            return 0;
        }
        catch (Exception exception) when (BadRow.IsRowError(exception))
        {
            // One bad row must not hold up the rest for ever: redo the batch row by row and leave out the bad ones.
            return CommitOneByOne(connection, commands, start, count);
        }
    }

    /// <summary>Drops the connection after a failure; the next commit opens a fresh one.</summary>
    public void Reset()
    {
        foreach (var statement in _prepared.Values) statement.Dispose();
        _prepared.Clear();
        _connection?.Dispose();
        _connection = null;
    }

    public void Dispose() => Reset();

    private void CommitRuns(SqliteConnection connection, List<StorageCommand> commands, int start, int count)
    {
        using var tx = connection.BeginTransaction();
        // Each statement is prepared once per connection with its parameters made once: Dapper's multi-exec made them
        // again for every row, twice the time for 10,000 hourly rows (tests/bench/Storage/HourlyStatsWrite.cs).
        for (var i = start; i < start + count; i++)
        {
            var (sql, row, _) = commands[i];
            if (!_prepared.TryGetValue(sql!, out var statement) || statement.RowType != row!.GetType())
            {
                statement?.Dispose();
                _prepared[sql!] = statement = new PreparedStatement(connection, sql!, row!.GetType());
            }
            statement.Run(row!, tx);
        }
        tx.Commit();
    }

    private int CommitOneByOne(SqliteConnection connection, List<StorageCommand> commands, int start, int count)
    {
        using var tx = connection.BeginTransaction();
        var rejected = 0;
        for (var i = start; i < start + count; i++)
        {
            var command = commands[i];
            tx.Save("row");
            try
            {
                connection.Execute(command.Sql!, command.Row, tx);
                tx.Release("row");
            }
            catch (Exception exception) when (BadRow.IsRowError(exception))
            {
                tx.Rollback("row");
                tx.Release("row");
                rejected++;
                LastRejection = exception.Message;
                StorageWriterLog.RowRejected(logger, command.Row?.GetType().Name ?? "?", exception.Message);
            }
        }
        tx.Commit();
        return rejected;
    }
}

using BenchmarkDotNet.Attributes;
using Dapper;
using LoopWatch.Storage;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Writing;
using Microsoft.Data.Sqlite;

namespace LoopWatch.Bench.Storage;

/// <summary>Upserting one hour of statistics for 10,000 loops; target under a second per hour's rows.</summary>
[MemoryDiagnoser]
public class HourlyStatsWrite
{
    private const int Loops = 10_000;
    private const long HourMs = 3_600_000;
    private string _folder = "";
    private LoopWatchDatabase _database = null!;
    private HourlyStatsRow[] _rows = [];
    private long _hour;

    [GlobalSetup]
    public void Setup()
    {
        _folder = Path.Combine(Path.GetTempPath(), "loopwatch-bench", Guid.NewGuid().ToString("N"));
        _database = LoopWatchDatabase.Open(Path.Combine(_folder, "bench.db"));
        _rows = new HourlyStatsRow[Loops];
        for (var i = 0; i < Loops; i++)
            _rows[i] = new HourlyStatsRow
            {
                LoopId = $"FIC-{i:D5}", HourMs = 0, Samples = 3600, PvMean = 50 + i % 7, PvMin = 40, PvMax = 60,
                SpMean = 50, OpMean = 45, OpMin = 30, OpMax = 70, MeanErrorPct = 0.4, ErrorStdPct = 1.1, Reversals = 40,
                TravelPct = 120, SaturatedPct = 0, TimeInAutoPct = 100, SecondsOscillating = 300, SecondsAnyFinding = 300,
            };
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        _database.Dispose();
        SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }

    /// <summary>10,000 new rows (a fresh hour each call) in one transaction through Dapper's multi-exec, as the writer did before it prepared its statements.</summary>
    [Benchmark]
    public int OneTransaction()
    {
        var hour = Interlocked.Increment(ref _hour) * HourMs;
        using var connection = _database.OpenConnection();
        using var tx = connection.BeginTransaction();
        var rows = new object[_rows.Length];
        for (var i = 0; i < rows.Length; i++) rows[i] = _rows[i] with { HourMs = hour };
        connection.Execute(WriteSql.UpsertHourlyStats, rows, tx); // multi-exec: one prepared command for all rows
        tx.Commit();
        return _rows.Length;
    }

    /// <summary>
    /// The same statement prepared once with its parameters created once and only their values set per row (Dapper's
    /// multi-exec builds the parameters again for every row); the writer's batch path now works this way.
    /// </summary>
    [Benchmark]
    public int PreparedOnce()
    {
        var hour = Interlocked.Increment(ref _hour) * HourMs;
        var properties = typeof(HourlyStatsRow).GetProperties();
        using var connection = _database.OpenConnection();
        using var tx = connection.BeginTransaction();
        using var command = connection.CreateCommand();
        command.Transaction = tx;
        command.CommandText = WriteSql.UpsertHourlyStats;
        var parameters = properties.Select(p => command.Parameters.Add(new SqliteParameter("@" + p.Name, DBNull.Value))).ToArray();
        command.Prepare();
        foreach (var row in _rows)
        {
            object boxed = row with { HourMs = hour };
            for (var i = 0; i < properties.Length; i++) parameters[i].Value = properties[i].GetValue(boxed) ?? DBNull.Value;
            command.ExecuteNonQuery();
        }
        tx.Commit();
        return _rows.Length;
    }

    /// <summary>The same rows through <see cref="StorageWriter"/>: post all, then flush (batches of the default size).</summary>
    [Benchmark]
    public async Task<long> ThroughWriter()
    {
        var hour = Interlocked.Increment(ref _hour) * HourMs;
        await using var writer = new StorageWriter(_database);
        foreach (var row in _rows) writer.Post(row with { HourMs = hour });
        await writer.FlushAsync();
        return writer.Counters.Written;
    }
}

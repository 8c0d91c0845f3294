using Dapper;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Writing;

namespace LoopWatch.Storage.Tests.Writing;

public sealed class StorageWriterTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task FlushAsync_After10000JournalPosts_AllRowsCommittedInFewerTransactions()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        await using var writer = new StorageWriter(db);

        for (var i = 0; i < 10_000; i++) Assert.True(writer.Post(SampleRows.Journal(i)));
        await writer.FlushAsync();

        var counters = writer.Counters;
        Assert.Equal(10_000, counters.Queued);
        Assert.Equal(10_000, counters.Written);
        Assert.Equal(0, counters.Pending);
        Assert.Equal(0, counters.Dropped);
        Assert.InRange(counters.Batches, 1, 9_999);
        Assert.Null(writer.Fault);
        using var raw = _temp.OpenRaw();
        Assert.Equal(10_000, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal"));
        Assert.Equal(10_000, raw.ExecuteScalar<long>("SELECT count(DISTINCT time_ms) FROM alarm_journal"));
        // SQLite docs, PRAGMA integrity_check: returns the single row "ok" when no problem is found.
        Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
    }

    [Fact]
    public async Task DisposeAsync_WithoutFlush_CommitsEverythingPosted()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var writer = new StorageWriter(db);
        for (var i = 0; i < 5_000; i++) writer.Post(SampleRows.Journal(i, "LIC-210"));

        await writer.DisposeAsync();

        Assert.Equal(5_000, writer.Counters.Written);
        Assert.False(writer.Post(SampleRows.Journal(1))); // closed: refused, not queued
        Assert.Equal(1, writer.Counters.Dropped);
        using var raw = _temp.OpenRaw();
        Assert.Equal(5_000, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal WHERE loop_id = 'LIC-210'"));
    }

    [Fact]
    public async Task Post_QueueFull_RefusesAndCountsDropped()
    {
        // A lock held by another connection keeps the writer from emptying its small queue and backlog.
        using var db = LoopWatchDatabase.Open(_temp.Options(o => o with
        {
            WriteQueueCapacity = 10, BacklogCapacity = 5, BatchSize = 5, BusyTimeout = TimeSpan.FromSeconds(1),
        }));
        using var locker = _temp.OpenRaw();
        locker.Execute("BEGIN EXCLUSIVE");
        var clock = new Microsoft.Extensions.Time.Testing.FakeTimeProvider();
        var writer = new StorageWriter(db, clock);

        var accepted = 0;
        for (var i = 0; i < 100; i++) if (writer.Post(SampleRows.Journal(i))) accepted++;

        // At most queue + backlog can be held; the rest is refused at once, whatever the writer has read so far.
        Assert.InRange(accepted, 10, 15);
        Assert.Equal(100 - accepted, writer.Counters.Dropped);
        locker.Execute("ROLLBACK");
        await Eventually.TrueAsync(() => writer.Counters.Written == accepted, "accepted rows written",
            () => clock.Advance(TimeSpan.FromMinutes(1)));
        await writer.DisposeAsync();
    }

    [Fact]
    public async Task Upserts_ReplaceRowsByKey()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        await using var writer = new StorageWriter(db);
        var reader = new LoopWatch.Storage.Reading.StorageReader(db);

        writer.Post(SampleRows.Hourly("PIC-400", SampleRows.T0, samples: 10));
        writer.Post(SampleRows.Hourly("PIC-400", SampleRows.T0, samples: 3600) with { PvMean = null });
        writer.Post(new AlarmStateRow("PIC-400", "oscillation", "unacked", "high", SampleRows.T0, null, null, null, null, SampleRows.T0));
        writer.Post(new AlarmStateRow("PIC-400", "oscillation", "shelved", "high", SampleRows.T0, "op1", SampleRows.T0 + 8 * SampleRows.Hour, "op1", "valve work", SampleRows.T0 + 5));
        await writer.FlushAsync();

        var hourly = Assert.Single(await reader.ReadHourlyStatsAsync("PIC-400", SampleRows.T0, SampleRows.T0 + SampleRows.Hour));
        Assert.Equal(3600, hourly.Samples);
        Assert.Null(hourly.PvMean);
        Assert.Equal(SampleRows.Hourly("PIC-400", SampleRows.T0) with { PvMean = null }, hourly);
        var state = Assert.Single(await reader.ReadAlarmStatesAsync());
        Assert.Equal(new AlarmStateRow("PIC-400", "oscillation", "shelved", "high", SampleRows.T0, "op1", SampleRows.T0 + 8 * SampleRows.Hour, "op1", "valve work", SampleRows.T0 + 5), state);
    }

    [Fact]
    public async Task Post_FromManyThreadsAtOnce_EveryRowWrittenOnce()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        await using var writer = new StorageWriter(db);

        await Task.WhenAll(Enumerable.Range(0, 8).Select(t => Task.Run(() =>
        {
            for (var i = 0; i < 2_000; i++) Assert.True(writer.Post(SampleRows.Journal(t * 10_000 + i, $"TIC-{300 + t}")));
        })));
        await writer.FlushAsync();

        using var raw = _temp.OpenRaw();
        Assert.Equal(16_000, raw.ExecuteScalar<long>("SELECT count(DISTINCT time_ms) FROM alarm_journal"));
        Assert.Equal(8, raw.ExecuteScalar<long>("SELECT count(DISTINCT loop_id) FROM alarm_journal"));
        Assert.Equal(16_000, writer.Counters.Written);
    }

    [Fact]
    public async Task FlushAsync_AfterComplete_ReturnsWithoutWaiting()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var writer = new StorageWriter(db);
        writer.Post(SampleRows.Journal(1));
        await writer.CompleteAsync();

        await writer.FlushAsync();

        Assert.Equal(1, writer.Counters.Written);
        await writer.DisposeAsync();
    }

    [Fact]
    public async Task Post_RowViolatingNotNull_IsRejectedAloneAndTheRestIsWritten()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        await using var writer = new StorageWriter(db);

        for (var i = 0; i < 10; i++) writer.Post(SampleRows.Journal(i));
        writer.Post(SampleRows.Journal(10) with { LoopId = null! }); // alarm_journal.loop_id is NOT NULL
        for (var i = 11; i < 20; i++) writer.Post(SampleRows.Journal(i));
        await writer.FlushAsync();

        Assert.Null(writer.Fault);
        Assert.Equal(1, writer.Counters.Rejected);
        Assert.Equal(19, writer.Counters.Written);
        Assert.Contains("NOT NULL", writer.Counters.LastError);
        using var raw = _temp.OpenRaw();
        Assert.Equal(19, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal"));
        Assert.Equal(0, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal WHERE time_ms = @T", new { T = SampleRows.T0 + 10 }));
    }
}

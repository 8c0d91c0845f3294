using Dapper;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Writing;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Time.Testing;

namespace LoopWatch.Storage.Tests.Writing;

public sealed class StorageWriterFaultTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task LockedDatabase_SetsFaultKeepsBacklog_ThenWritesAllWhenLockReleased()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options(o => o with { BusyTimeout = TimeSpan.FromSeconds(1) }));
        var clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero));
        var log = new RecordingLogger<StorageWriter>();
        await using var writer = new StorageWriter(db, clock, log);
        using var locker = _temp.OpenRaw();
        // SQLite docs, "BEGIN TRANSACTION" (from memory): EXCLUSIVE takes the write lock at once and in WAL mode acts like
        // IMMEDIATE, so readers go on while other writers get SQLITE_BUSY ("database is locked").
        locker.Execute("BEGIN EXCLUSIVE");

        for (var i = 0; i < 100; i++) writer.Post(SampleRows.Journal(i, "FIC-120"));
        var flushed = writer.FlushAsync();

        await Eventually.TrueAsync(() => writer.Fault is not null, "fault reported");
        Assert.Equal(clock.GetUtcNow(), writer.Fault!.Since);
        Assert.Contains("locked", writer.Fault.Text);
        // The writer may have taken only the first posts into its backlog before it failed; the rest wait in the queue,
        // and the flush marker behind them is not a row.
        Assert.Equal(100, writer.Counters.Pending);
        Assert.InRange(writer.Counters.Backlog, 1, 100);
        Assert.Equal(0, writer.Counters.Written);
        Assert.True(writer.Counters.Failed >= 1);
        Assert.NotNull(writer.Counters.LastError);
        Assert.False(flushed.IsCompleted);

        // Still locked: advancing the clock gives more failing retries, each first taking the queue into the backlog.
        var failedBefore = writer.Counters.Failed;
        await Eventually.TrueAsync(() => writer.Counters.Failed > failedBefore, "a further failing retry",
            () => clock.Advance(TimeSpan.FromSeconds(1)));
        Assert.Equal(100, writer.Counters.Backlog);
        Assert.Equal(100, writer.Counters.Pending);
        Assert.NotNull(writer.Fault);

        locker.Execute("ROLLBACK");
        for (var i = 100; i < 150; i++) writer.Post(SampleRows.Journal(i, "FIC-120"));
        await Eventually.TrueAsync(() => writer.Counters.Written == 150, "backlog and later posts written",
            () => clock.Advance(TimeSpan.FromSeconds(30)));

        await flushed;
        Assert.Null(writer.Fault);
        Assert.Equal(0, writer.Counters.Pending);
        Assert.Equal(0, writer.Counters.Dropped);
        using var raw = _temp.OpenRaw();
        Assert.Equal(150, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal WHERE loop_id = 'FIC-120'"));
        Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
        // One error when the fault starts (5011), quieter retries (5012), one note on recovery (5013).
        Assert.Equal(1, log.Entries.Count(e => e.EventId == 5011 && e.Level == LogLevel.Error));
        Assert.Contains(log.Entries, e => e.EventId == 5012);
        Assert.Equal(1, log.Entries.Count(e => e.EventId == 5013));
    }

    [Fact]
    public async Task DisposeAsync_FaultNeverClears_GivesUpAfterShutdownTimeoutAndCountsLost()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options(o => o with
        {
            BusyTimeout = TimeSpan.FromSeconds(1), ShutdownTimeout = TimeSpan.FromSeconds(10),
        }));
        var clock = new FakeTimeProvider();
        var log = new RecordingLogger<StorageWriter>();
        var writer = new StorageWriter(db, clock, log);
        using var locker = _temp.OpenRaw();
        locker.Execute("BEGIN EXCLUSIVE");
        for (var i = 0; i < 20; i++) writer.Post(SampleRows.Journal(i));
        await Eventually.TrueAsync(() => writer.Fault is not null, "fault reported");

        var disposing = writer.DisposeAsync().AsTask();
        await Eventually.TrueAsync(() => disposing.IsCompleted, "dispose gives up",
            () => clock.Advance(TimeSpan.FromSeconds(5)));

        await disposing;
        Assert.Equal(20, writer.Counters.Dropped);
        Assert.Equal(0, writer.Counters.Written);
        Assert.Contains(log.Entries, e => e.EventId == 5015 && e.Message.Contains("20"));
        locker.Execute("ROLLBACK");
    }

    [Fact]
    public async Task ReadOnlyFile_NamesFaultKeepsBacklog_ThenWritesAllAndNoPooledReadOnlyConnectionIsLeft()
    {
        using (LoopWatchDatabase.Open(_temp.Options())) { }
        SqliteConnection.ClearAllPools();
        using var immutable = ImmutableFiles.Set(_temp.DatabasePath);
        // A current schema needs no migration, so the read-only file opens (SQLite falls back to a read-only handle).
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var clock = new FakeTimeProvider(new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero));
        var log = new RecordingLogger<StorageWriter>();
        await using var writer = new StorageWriter(db, clock, log);
        for (var i = 0; i < 50; i++) writer.Post(SampleRows.Journal(i, "FIC-130"));

        await Eventually.TrueAsync(() => writer.Fault is not null, "fault reported");
        // SQLite docs, "Result and Error Codes": SQLITE_READONLY (8), "attempt to write a readonly database".
        Assert.StartsWith("database is read-only", writer.Fault!.Text);
        Assert.Equal(50, writer.Counters.Pending); // queue plus backlog: the writer may have failed on the first few
        Assert.Equal(0, writer.Counters.Written);
        // A reader during the fault leaves a pooled connection that SQLite opened read-only.
        using (var reader = db.OpenConnection()) Assert.Equal(0, reader.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal"));

        immutable.Dispose();
        await Eventually.TrueAsync(() => writer.Counters.Written == 50, "backlog written once the file is writable",
            () => clock.Advance(TimeSpan.FromSeconds(30)));
        Assert.Null(writer.Fault);
        Assert.Equal(0, writer.Counters.Dropped);
        Assert.Equal(1, log.Entries.Count(e => e.EventId == 5001 && e.Level == LogLevel.Warning));
        Assert.Equal(1, log.Entries.Count(e => e.EventId == 5002));
        // The pooled read-only connection was dropped: a write through the pool (user store, retention) works again.
        using (var pooled = db.OpenConnection()) pooled.Execute("CREATE TABLE probe (x INTEGER)");
        using var raw = _temp.OpenRaw();
        Assert.Equal(50, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal WHERE loop_id = 'FIC-130'"));
        Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
    }
}

using Dapper;
using LoopWatch.Storage.Tests.Support;

namespace LoopWatch.Storage.Tests;

public sealed class LoopWatchDatabaseTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public void Open_SetsWalAndConnectionPragmas()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options(o => o with { BusyTimeout = TimeSpan.FromSeconds(3) }));
        using var c = db.OpenConnection();

        // SQLite docs, PRAGMA journal_mode: returns the new mode, "wal", and WAL mode persists in the file.
        Assert.Equal("wal", c.ExecuteScalar<string>("PRAGMA journal_mode"));
        using (var raw = _temp.OpenRaw())
            Assert.Equal("wal", raw.ExecuteScalar<string>("PRAGMA journal_mode"));
        // SQLite docs, PRAGMA synchronous: 1 is NORMAL.
        Assert.Equal(1, c.ExecuteScalar<int>("PRAGMA synchronous"));
        Assert.Equal(1, c.ExecuteScalar<int>("PRAGMA foreign_keys"));
        // SQLite docs, PRAGMA busy_timeout: reads back the handler's timeout in milliseconds.
        Assert.Equal(3000, c.ExecuteScalar<int>("PRAGMA busy_timeout"));
    }

    [Fact]
    public void AlarmJournal_IsAppendOnly()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        using var c = db.OpenConnection();
        c.Execute("INSERT INTO alarm_journal (time_ms, loop_id, kind, priority, from_state, to_state) VALUES (1, 'TIC-301', 'stale', 'low', 'normal', 'unacked')");

        // Common practice, no source: alarm history is an audit record; corrections are new rows, never edits.
        var error = Assert.ThrowsAny<Exception>(() => c.Execute("UPDATE alarm_journal SET to_state = 'normal'"));

        Assert.Contains("append-only", error.Message);
    }
}

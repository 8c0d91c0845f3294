using Dapper;
using LoopWatch.Storage.Retention;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Writing;
using Microsoft.Extensions.Time.Testing;

namespace LoopWatch.Storage.Tests.Retention;

public sealed class RetentionPrunerTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task PruneExpiredAsync_RemovesOnlyJournalAndHourlyRowsOlderThanRetention()
    {
        var now = new DateTimeOffset(2027, 6, 1, 0, 0, 0, TimeSpan.Zero);
        var cutoff = now - TimeSpan.FromDays(400);
        var cutoffMs = cutoff.ToUnixTimeMilliseconds();
        using var db = LoopWatchDatabase.Open(_temp.Options());
        await using (var writer = new StorageWriter(db))
        {
            // 12,000 old journal rows cross several delete chunks.
            for (var i = 0; i < 12_000; i++) writer.Post(SampleRows.Journal(0) with { TimeMs = cutoffMs - 1 - i });
            writer.Post(SampleRows.Journal(0) with { TimeMs = cutoffMs, Comment = "kept: exactly at cutoff" });
            writer.Post(SampleRows.Journal(0) with { TimeMs = now.ToUnixTimeMilliseconds() - 1 });
            writer.Post(SampleRows.Hourly("FIC-101", cutoffMs - SampleRows.Hour));
            writer.Post(SampleRows.Hourly("FIC-101", cutoffMs));
            writer.Post(SampleRows.Hourly("FIC-101", cutoffMs + SampleRows.Hour));
            writer.Post(new AlarmStateRow("FIC-101", "oscillation", "unacked", "high", 1, null, null, null, null, 1));
            writer.Post(new ElementCounterRow("FIC-101", "FV-101", 1, 5, 1.0, null, 1));
            writer.Post(new ElementReset("FIC-101", "FV-101", 2, "tech1", null));
        }

        Assert.Equal(400, db.Options.RetentionDays); // the documented default
        var result = await new RetentionPruner(db, new FakeTimeProvider(now)).PruneExpiredAsync();

        Assert.Equal(new PruneResult(12_000, 1), result);
        using var raw = _temp.OpenRaw();
        Assert.Equal([cutoffMs, now.ToUnixTimeMilliseconds() - 1], raw.Query<long>("SELECT time_ms FROM alarm_journal ORDER BY time_ms"));
        Assert.Equal([cutoffMs, cutoffMs + SampleRows.Hour], raw.Query<long>("SELECT hour_ms FROM hourly_stats ORDER BY hour_ms"));
        Assert.Equal(1, raw.ExecuteScalar<int>("SELECT count(*) FROM alarm_state"));
        Assert.Equal(1, raw.ExecuteScalar<int>("SELECT count(*) FROM element_periods"));
        Assert.Equal(1, raw.ExecuteScalar<int>("SELECT count(*) FROM service_records"));
        Assert.Equal(new PruneResult(0, 0), await new RetentionPruner(db, new FakeTimeProvider(now)).PruneExpiredAsync());
    }
}

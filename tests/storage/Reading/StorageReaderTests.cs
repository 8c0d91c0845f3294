using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Writing;

namespace LoopWatch.Storage.Tests.Reading;

public sealed class StorageReaderTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task ReadJournalAsync_FiltersByTimeLoopKindAndLimit()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var reader = new StorageReader(db);
        await using (var writer = new StorageWriter(db))
        {
            for (var i = 0; i < 10; i++)
            {
                writer.Post(SampleRows.Journal(i, "FIC-101"));
                writer.Post(SampleRows.Journal(i, "TIC-301") with { Kind = "stale" });
            }
        }
        var t0 = SampleRows.T0;

        var all = await reader.ReadJournalAsync(new JournalQuery(t0, t0 + 10));
        Assert.Equal(20, all.Count);
        Assert.Equal(t0 + 9, all[0].TimeMs); // newest first by default

        var window = await reader.ReadJournalAsync(new JournalQuery(t0 + 2, t0 + 5, LoopId: "FIC-101", OldestFirst: true));
        Assert.Equal([t0 + 2, t0 + 3, t0 + 4], window.Select(e => e.TimeMs)); // from inclusive, to exclusive

        var stale = await reader.ReadJournalAsync(new JournalQuery(t0, t0 + 10, Kind: "stale", Limit: 3));
        Assert.Equal(3, stale.Count);
        Assert.All(stale, e => Assert.Equal(("TIC-301", "stale"), (e.LoopId, e.Kind)));
        Assert.Equal([t0 + 9, t0 + 8, t0 + 7], stale.Select(e => e.TimeMs));

        Assert.Empty(await reader.ReadJournalAsync(new JournalQuery(t0, t0 + 10, LoopId: "FIC-999")));
    }

    [Fact]
    public async Task ReadHourlyStatsAsync_OneLoopAndAllLoopsBetweenTimes()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var reader = new StorageReader(db);
        var t0 = SampleRows.T0;
        await using (var writer = new StorageWriter(db))
            foreach (var loop in new[] { "FIC-101", "LIC-210", "PIC-400" })
                for (var h = 0; h < 24 * 8; h++)
                    writer.Post(SampleRows.Hourly(loop, t0 + h * SampleRows.Hour));

        var day2 = await reader.ReadHourlyStatsAsync("LIC-210", t0 + 24 * SampleRows.Hour, t0 + 48 * SampleRows.Hour);
        Assert.Equal(24, day2.Count);
        Assert.All(day2, r => Assert.Equal("LIC-210", r.LoopId));
        Assert.Equal(Enumerable.Range(24, 24).Select(h => t0 + h * SampleRows.Hour), day2.Select(r => r.HourMs));

        var week = await reader.ReadHourlyStatsAsync(t0, t0 + 7 * 24 * SampleRows.Hour);
        Assert.Equal(3 * 7 * 24, week.Count);
        Assert.Equal(["FIC-101", "LIC-210", "PIC-400"], week.Select(r => r.LoopId).Distinct());
    }
}

using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Writing;

namespace LoopWatch.Storage.Tests.Writing;

public sealed class ElementResetTests : IDisposable
{
    private const string Loop = "FIC-101";
    private const string Valve = "FV-101";
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task Reset_KeepsOldCountersInPeriodsAndStartsNewPeriodAtZero()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var reader = new StorageReader(db);
        var t0 = SampleRows.T0;
        var resetAt = t0 + 30L * 24 * SampleRows.Hour;
        await using var writer = new StorageWriter(db);

        writer.Post(new ElementCounterRow(Loop, Valve, t0, 1_000, 2_500.0, """{"0-2":900,"2-5":100}""", t0 + 1));
        writer.Post(new ElementCounterRow(Loop, Valve, t0, 1_234, 3_100.5, """{"0-2":1100,"2-5":134}""", t0 + 2));
        writer.Post(new ElementReset(Loop, Valve, resetAt, "tech1", "packing replaced"));
        // Posted before the reset was known (still the old period): must not overwrite the fresh zero counters.
        writer.Post(new ElementCounterRow(Loop, Valve, t0, 1_240, 3_120.0, null, resetAt + 1));
        await writer.FlushAsync();

        var period = Assert.Single(await reader.ReadPeriodsAsync(Loop));
        Assert.Equal(new ElementPeriodRow(period.Id, Loop, Valve, t0, resetAt, 1_234, 3_100.5,
            """{"0-2":1100,"2-5":134}""", "tech1", "packing replaced"), period);
        Assert.Equal(new ElementCounterRow(Loop, Valve, resetAt, 0, 0.0, null, resetAt),
            Assert.Single(await reader.ReadCountersAsync(Loop)));
        var record = Assert.Single(await reader.ReadServiceRecordsAsync(Loop));
        Assert.Equal(("tech1", "packing replaced", resetAt), (record.User, record.Note, record.TimeMs));

        // The new period counts up from zero; a second reset closes it too and keeps the first period.
        writer.Post(new ElementCounterRow(Loop, Valve, resetAt, 7, 12.5, null, resetAt + 5));
        writer.Post(new ElementReset(Loop, Valve, resetAt + 10, "tech2", null));
        await writer.FlushAsync();

        var periods = await reader.ReadPeriodsAsync(Loop, Valve);
        Assert.Equal([(t0, resetAt, 1_234L), (resetAt, resetAt + 10, 7L)], periods.Select(p => (p.StartMs, p.EndMs, p.Reversals)));
        Assert.Equal(0, Assert.Single(await reader.ReadCountersAsync()).Reversals);
    }

    [Fact]
    public async Task Reset_ElementWithoutCounters_StartsPeriodAndRecordsServiceOnly()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var reader = new StorageReader(db);
        await using var writer = new StorageWriter(db);

        writer.Post(new ElementReset("LIC-220", "P-220", SampleRows.T0, "tech1", "new pump"));
        await writer.FlushAsync();

        Assert.Empty(await reader.ReadPeriodsAsync("LIC-220"));
        Assert.Equal(SampleRows.T0, Assert.Single(await reader.ReadCountersAsync("LIC-220")).PeriodStartMs);
        Assert.Single(await reader.ReadServiceRecordsAsync("LIC-220"));
    }
}

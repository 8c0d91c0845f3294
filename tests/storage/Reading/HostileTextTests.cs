using Dapper;
using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Writing;

namespace LoopWatch.Storage.Tests.Reading;

public sealed class HostileTextTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    public static TheoryData<string> HostileTexts() => new()
    {
        "O'Brien's \"valve\"",
        "'; DROP TABLE alarm_journal; --",
        "\"); DELETE FROM alarm_state; --",
        "<script>alert('x')</script>",
        "Ventil Δp ≥ 2 bar — 冷却水 🌡️",
        "line one\nline two\ttab\r\n",
        "nul\0inside",
        "%_*?[]\\",
        new string('x', 10_000),
        string.Concat(Enumerable.Repeat("'\"; -- ", 1_500)),
    };

    [Theory]
    [MemberData(nameof(HostileTexts))]
    public async Task HostileText_RoundTripsIntactThroughEveryTable(string text)
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var reader = new StorageReader(db);
        var journal = new AlarmJournalEntry(SampleRows.T0, text, text, text, text, text, text, text, text);
        var state = new AlarmStateRow(text, text, text, text, 1, text, 2, text, text, 3);
        var counters = new ElementCounterRow(text, text, 10, 4, 5.5, text, 11);
        var service = new ServiceRecordRow(text, text, SampleRows.T0, text, text);

        await using (var writer = new StorageWriter(db))
        {
            writer.Post(journal);
            writer.Post(state);
            writer.Post(SampleRows.Hourly(text, SampleRows.T0));
            writer.Post(counters);
            writer.Post(service);
            writer.Post(new ElementReset(text, text, 20, text, text));
        }

        var readJournal = Assert.Single(await reader.ReadJournalAsync(new JournalQuery(0, long.MaxValue, text, text)));
        Assert.Equal(journal with { Id = readJournal.Id }, readJournal);
        Assert.Equal(state, Assert.Single(await reader.ReadAlarmStatesAsync()));
        Assert.Equal(SampleRows.Hourly(text, SampleRows.T0), Assert.Single(await reader.ReadHourlyStatsAsync(text, 0, long.MaxValue)));
        var period = Assert.Single(await reader.ReadPeriodsAsync(text, text));
        Assert.Equal(new ElementPeriodRow(period.Id, text, text, 10, 20, 4, 5.5, text, text, text), period);
        var records = await reader.ReadServiceRecordsAsync(text);
        Assert.All(records, r => Assert.Equal((text, text, text), (r.LoopId, r.Element, r.User)));
        Assert.Equal(2, records.Count);
        using var raw = _temp.OpenRaw();
        Assert.Equal(8, raw.ExecuteScalar<int>("SELECT count(*) FROM sqlite_schema WHERE type = 'table'")); // nothing dropped
        Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
    }
}

using LoopWatch.Storage;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Writing;
using Microsoft.Data.Sqlite;

namespace LoopWatch.Agent.Tests.Report;

/// <summary>
/// <c>loopwatch report weekly</c> over two agents' real SQLite files: the plant-wide figures equal a hand count over
/// both, and a loop-hour stored by both agents (a loop that moved shards) counts once.
/// </summary>
public sealed class WeeklyReportTests : IDisposable
{
    private const long HourMs = 3_600_000;
    private static readonly long H0 = new DateTimeOffset(2026, 3, 2, 0, 0, 0, TimeSpan.Zero).ToUnixTimeMilliseconds(); // a Monday
    private readonly string _folder = Directory.CreateTempSubdirectory("lw-report-").FullName;

    private static HourlyStatsRow Row(string loop, int hour, double anyFinding, double osc = 0, double offset = 0) => new()
    {
        LoopId = loop, HourMs = H0 + hour * HourMs, Samples = 3600, SecondsAnyFinding = anyFinding, SecondsOscillating = osc,
        SecondsOffset = offset, Reversals = 10,
    };

    private async Task<string> StoreAsync(string name, IEnumerable<HourlyStatsRow> rows, IEnumerable<AlarmJournalEntry> journal)
    {
        var path = Path.Combine(_folder, name);
        using var db = LoopWatchDatabase.Open(path);
        await using var writer = new StorageWriter(db);
        foreach (var r in rows) Assert.True(writer.Post(r));
        foreach (var j in journal) Assert.True(writer.Post(j));
        await writer.FlushAsync();
        return path;
    }

    private async Task<(string A, string B)> TwoAgentsAsync()
    {
        // Agent A: FIC-101, 10 hours, hours 0-2 oscillating 1,200 s (unhealthy); one alarm activation.
        var a = await StoreAsync("a.db",
            Enumerable.Range(0, 10).Select(h => Row("FIC-101", h, h < 3 ? 1200 : 0, osc: h < 3 ? 1200 : 0)),
            [new(H0 + 1_000, "FIC-101", "oscillation", "low", "normal", "unacknowledged")]);
        // Agent B: PIC-201, 5 hours each with an offset the whole hour; FIC-101's hour 9 again (it moved shards); one activation.
        var b = await StoreAsync("b.db",
            Enumerable.Range(24, 5).Select(h => Row("PIC-201", h, 3600, offset: 3600)).Append(Row("FIC-101", 9, 0)),
            [new(H0 + 90_000_000, "PIC-201", "sustained-offset", "low", "normal", "unacknowledged")]);
        return (a, b);
    }

    [Fact]
    public async Task Csv_over_two_databases_equals_the_hand_count_of_both()
    {
        var (a, b) = await TwoAgentsAsync();
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        Assert.Equal(0, await Cli.RunAsync(["report", "weekly", "--db", a, "--db", b, "--week", "2026-03-04", "--format", "csv"], stdout, stderr));
        var rows = stdout.ToString().Split("\r\n", StringSplitOptions.RemoveEmptyEntries).Skip(1).Select(l => l.Split(',')).ToDictionary(f => f[1]);
        Assert.Equal(2, rows.Count);
        // Hand count: FIC-101 10 hours (hour 9 once), 7 healthy; PIC-201 5 hours, none healthy, 5 h of offset.
        Assert.Equal(["2026-03-02", "FIC-101", "(not configured)", "10", "7", "70.0", "1.00", "0.00", "100"], rows["FIC-101"][..9]);
        Assert.Equal(["2026-03-02", "PIC-201", "(not configured)", "5", "0", "0.0", "0.00", "5.00", "50"], rows["PIC-201"][..9]);
    }

    [Fact]
    public async Task Text_gives_plant_wide_totals_and_the_alarms_of_both_agents()
    {
        var (a, b) = await TwoAgentsAsync();
        var stdout = new StringWriter();
        Assert.Equal(0, await Cli.RunAsync(["report", "weekly", "--db", a, "--db", b, "--week", "2026-03-02"], stdout, new StringWriter()));
        var text = stdout.ToString();
        // 15 loop-hours, 7 healthy: 46.7 %; one activation from each database.
        Assert.Contains("loops monitored 2, loop-hours with samples 15, healthy 46.7 %", text);
        Assert.Contains("alarms: 2 activations", text);
        Assert.Contains("2 database(s)", text);
    }

    [Fact]
    public async Task A_missing_database_is_a_usage_error()
    {
        var stderr = new StringWriter();
        Assert.Equal(2, await Cli.RunAsync(["report", "weekly", "--db", Path.Combine(_folder, "none.db")], new StringWriter(), stderr));
        Assert.Contains("--db", stderr.ToString());
    }

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(_folder, recursive: true); } catch (IOException) { }
    }
}

using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage;
using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Writing;
using Microsoft.Data.Sqlite;

namespace LoopWatch.Dashboard.Tests.Reports;

public sealed class WeeklySummaryTests : IDisposable
{
    // 2026-03-02 is a Monday (ISO 8601 weeks start on Monday).
    private static readonly ReportWeek Week = ReportWeek.Containing(new DateOnly(2026, 3, 2), TimeZoneInfo.Utc);
    private static readonly long H0 = Week.Start.ToUnixTimeMilliseconds();
    private const long HourMs = 3_600_000;

    private static readonly KeyValuePair<string, string>[] Areas =
    [
        new("FIC-101", "Intake"), new("PIC-201", "Intake"), new("TIC-401", "Boiler house"), new("FIC-104", "Boiler house"),
    ];

    private readonly string _folder = Directory.CreateTempSubdirectory("lw-weekly-").FullName;

    private static HourlyStatsRow Row(string loop, long hourMs, long samples = 3600, double? anyFinding = 0, double? osc = null,
        double? offset = null, long? reversals = null) => new()
    {
        LoopId = loop, HourMs = hourMs, Samples = samples, SecondsAnyFinding = anyFinding, SecondsOscillating = osc,
        SecondsOffset = offset, Reversals = reversals,
    };

    // The constructed week: every figure below is counted by hand from these rows.
    private static IEnumerable<HourlyStatsRow> ConstructedWeek()
    {
        // FIC-101: 10 hours, hours 0-2 oscillating 1,200 s each (unhealthy), 50 reversals an hour.
        for (var h = 0; h < 10; h++)
            yield return Row("FIC-101", H0 + h * HourMs, anyFinding: h < 3 ? 1200 : 0, osc: h < 3 ? 1200 : 0, offset: 0, reversals: 50);
        // PIC-201: 5 hours, each a full hour with an offset; 10 reversals an hour.
        for (var h = 0; h < 5; h++)
            yield return Row("PIC-201", H0 + (24 + h) * HourMs, anyFinding: 3600, osc: 0, offset: 3600, reversals: 10);
        // TIC-401 (on-off, no reversal figure): 4 healthy hours, one with a null finding time, and one hour without samples.
        for (var h = 0; h < 4; h++)
            yield return Row("TIC-401", H0 + (48 + h) * HourMs, anyFinding: h == 3 ? null : 0);
        yield return Row("TIC-401", H0 + 52 * HourMs, samples: 0, anyFinding: 3600);
        // LIC-999 is not in the plant's loop list any more: 2 healthy hours.
        for (var h = 0; h < 2; h++) yield return Row("LIC-999", H0 + (100 + h) * HourMs, reversals: 4);
        // Outside the week on both sides: must not count.
        yield return Row("FIC-101", H0 - HourMs, anyFinding: 3600, osc: 3600, reversals: 1000);
        yield return Row("FIC-101", Week.End.ToUnixTimeMilliseconds(), anyFinding: 3600, osc: 3600, reversals: 1000);
    }

    private static readonly AlarmJournalEntry[] Journal =
    [
        new(H0 + 1_000, "FIC-101", "oscillation", "medium", "normal", "unacknowledged"),
        new(H0 + 60_000, "FIC-101", "oscillation", "medium", "unacknowledged", "acknowledged", User: "op.one"),
        new(H0 + 90_000_000, "PIC-201", "offset", "low", "normal", "unacknowledged"),
        new(H0 + 90_100_000, "PIC-201", "offset", "low", "returned-unacknowledged", "unacknowledged"),
        new(H0 - 1, "PIC-201", "offset", "low", "normal", "unacknowledged"), // the week before
    ];

    private async Task<IReadOnlyList<HourlyStatsRow>> StoreAndReadAsync(IEnumerable<HourlyStatsRow> rows)
    {
        var options = new StorageOptions { DatabasePath = Path.Combine(_folder, "loopwatch.db") };
        using var db = LoopWatchDatabase.Open(options);
        await using (var writer = new StorageWriter(db))
        {
            foreach (var r in rows) Assert.True(writer.Post(r));
            await writer.FlushAsync();
        }
        // Read a wider range than the week so the summary's own bounds are what excludes the outside rows.
        return await new StorageReader(db).ReadHourlyStatsAsync(H0 - 7 * 24 * HourMs, Week.End.ToUnixTimeMilliseconds() + 7 * 24 * HourMs);
    }

    [Fact]
    public async Task Figures_from_stored_hourly_statistics_equal_a_hand_count()
    {
        var stored = await StoreAndReadAsync(ConstructedWeek());
        Assert.Equal(ConstructedWeek().Count(), stored.Count); // every row went through SQLite

        var s = WeeklySummary.Compute(Week, stored, Areas, Journal);

        // Hand count: loops with samples FIC-101, PIC-201, TIC-401, LIC-999 (FIC-104 has none).
        Assert.Equal(4, s.LoopsMonitored);
        // Loop-hours with samples 10 + 5 + 4 + 2 = 21; healthy 7 + 0 + 4 + 2 = 13 (a null finding time counts as none).
        Assert.Equal(21, s.Hours);
        Assert.Equal(13, s.HealthyHours);
        Assert.Equal(100.0 * 13 / 21, s.HealthyPct!.Value, 10);

        var intake = s.Areas.Single(a => a.Area == "Intake");
        Assert.Equal((2, 15, 7), (intake.Loops, intake.Hours, intake.HealthyHours));
        var boiler = s.Areas.Single(a => a.Area == "Boiler house");
        Assert.Equal((1, 4, 4), (boiler.Loops, boiler.Hours, boiler.HealthyHours));
        var unknown = s.Areas.Single(a => a.Area == WeeklySummary.UnknownArea);
        Assert.Equal((1, 2, 2), (unknown.Loops, unknown.Hours, unknown.HealthyHours));

        var fic101 = s.Loops.Single(l => l.LoopId == "FIC-101");
        Assert.Equal((10, 7, 3600.0, 500L), (fic101.Hours, fic101.HealthyHours, fic101.SecondsOscillating, fic101.Reversals));
        Assert.Equal(0, s.Loops.Single(l => l.LoopId == "FIC-104").Hours); // configured, listed, no data

        Assert.Equal(["FIC-101"], s.TopOscillating.Select(l => l.LoopId));
        Assert.Equal(["PIC-201"], s.TopOffset.Select(l => l.LoopId));
        Assert.Equal(18_000, s.TopOffset[0].SecondsOffset);
        Assert.Equal(["FIC-101", "PIC-201", "LIC-999"], s.TopReversals.Select(l => l.LoopId)); // 500, 50, 8

        // Activations are transitions into unacknowledged: 3 in the week; a week has 1,008 ten-minute periods.
        Assert.Equal(3, s.Alarms.Activations);
        Assert.Equal(3.0 / 1008, s.Alarms.PerTenMinutes, 12);
        // EEMUA 191 (from memory): about 1 per 10 minutes is acceptable.
        Assert.Equal("acceptable", s.Alarms.Rating);
    }

    [Fact]
    public void Week_over_week_compares_against_the_week_before()
    {
        var before = Week.Before();
        var previousRows = Enumerable.Range(0, 10).Select(h => Row("FIC-101", before.Start.ToUnixTimeMilliseconds() + h * HourMs)).ToList();
        var all = ConstructedWeek().Concat(previousRows).ToList();
        var change = new WeekOverWeek(WeeklySummary.Compute(Week, all, Areas, Journal), WeeklySummary.Compute(before, all, Areas, Journal));

        // The week before: FIC-101 10 healthy hours only (plus the rows at its last hour from ConstructedWeek, one unhealthy).
        Assert.Equal(1, change.Previous.LoopsMonitored);
        Assert.Equal(11, change.Previous.Hours);
        Assert.Equal(10, change.Previous.HealthyHours);
        Assert.Equal(100.0 * 13 / 21 - 100.0 * 10 / 11, change.HealthyPctChange!.Value, 10);
        Assert.Equal(3, change.LoopsChange);
        Assert.Equal(3 - 1, change.ActivationsChange);
    }

    [Fact]
    public void Top_lists_hold_the_ten_worst_with_ties_by_loop_id()
    {
        var rows = Enumerable.Range(1, 12).Select(i => Row($"L-{i:00}", H0, anyFinding: 60, osc: i == 12 ? 5 * 60 : i * 60)).ToList();
        var s = WeeklySummary.Compute(Week, rows, [], []);
        // L-12 has 300 s, equal to L-05: the tie goes by id, so L-05 comes before L-12.
        Assert.Equal(["L-11", "L-10", "L-09", "L-08", "L-07", "L-06", "L-05", "L-12", "L-04", "L-03"], s.TopOscillating.Select(l => l.LoopId));
        Assert.Equal(12, s.LoopsMonitored);
        Assert.Equal(0, s.HealthyHours);
    }

    [Fact]
    public void Csv_has_one_row_per_loop_and_defuses_formula_text()
    {
        var rows = ConstructedWeek().Append(Row("=HYPERLINK(1)", H0)).ToList();
        var s = WeeklySummary.Compute(Week, rows, [.. Areas, new("TIC-402", "Boiler, \"north\"")], Journal);
        var lines = WeeklyCsv.Write(s).Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(string.Join(',', WeeklyCsv.Columns), lines[0]);
        Assert.Equal(s.Loops.Count + 1, lines.Length);
        Assert.Contains("2026-03-02,FIC-101,Intake,10,7,70.0,1.00,0.00,500,1.00,0.00,0.00", lines);
        Assert.Contains("2026-03-02,PIC-201,Intake,5,0,0.0,0.00,5.00,50,5.00,0.00,0.00", lines);
        Assert.Contains("2026-03-02,FIC-104,Boiler house,0,0,,0.00,0.00,0,0.00,0.00,0.00", lines);
        // RFC 4180: a field with a comma or quote is quoted and its quotes doubled.
        Assert.Contains("2026-03-02,TIC-402,\"Boiler, \"\"north\"\"\",0,0,,0.00,0.00,0,0.00,0.00,0.00", lines);
        // OWASP CSV injection guidance: a leading '=' is prefixed so spreadsheets show text, not a formula.
        Assert.Contains(lines, l => l.StartsWith("2026-03-02,'=HYPERLINK(1),", StringComparison.Ordinal));
    }

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }
}

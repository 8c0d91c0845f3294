using System.Globalization;
using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Dashboard.Model;
using LoopWatch.Dashboard.Reports;
using LoopWatch.Dashboard.Tests.Infrastructure;
using LoopWatch.Storage.Rows;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class WeeklyPageTests
{
    private const long HourMs = 3_600_000;

    [Fact]
    public async Task The_weekly_summary_shows_the_stored_week_and_downloads_it_as_csv()
    {
        var north = TestLoops.Pid("FIC-990");
        north.Area = "North yard";
        var south = TestLoops.Pid("PIC-991");
        south.Area = "South yard";
        await using var agent = await RunningAgent.StartAsync([north, south], embedded: true, brokerPort: FreePort.Next());
        var services = agent.App.Services;
        // A recent week, so retention (400 days of plant time) keeps it; the plant clock is the wall clock without data.
        var week = ReportWeek.LastComplete(services.GetRequiredService<IPlantView>().Now, TimeZoneInfo.Utc).Before();
        var h0 = week.Start.ToUnixTimeMilliseconds();
        var writer = services.GetRequiredService<AgentStorage>().Writer;
        // FIC-990: 20 hours, 5 of them oscillating 1,800 s; PIC-991: 10 hours, 2 with an offset of 900 s, 300 reversals an hour.
        for (var h = 0; h < 20; h++)
            writer.Post(new HourlyStatsRow { LoopId = "FIC-990", HourMs = h0 + h * HourMs, Samples = 3600, Reversals = 20,
                SecondsOscillating = h < 5 ? 1800 : 0, SecondsAnyFinding = h < 5 ? 1800 : 0 });
        for (var h = 0; h < 10; h++)
            writer.Post(new HourlyStatsRow { LoopId = "PIC-991", HourMs = h0 + (30 + h) * HourMs, Samples = 3600, Reversals = 300,
                SecondsOffset = h < 2 ? 900 : 0, SecondsAnyFinding = h < 2 ? 900 : 0 });
        // The week before: FIC-990 for 10 hours, all healthy.
        for (var h = 0; h < 10; h++)
            writer.Post(new HourlyStatsRow { LoopId = "FIC-990", HourMs = week.Before().Start.ToUnixTimeMilliseconds() + h * HourMs, Samples = 3600, SecondsAnyFinding = 0 });
        await PageRig.FlushAsync(agent);

        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync(new() { AcceptDownloads = true });
        await page.GotoAsync(agent.Http.BaseAddress + "weekly?week=" + week.Key);
        Assert.Contains(week.Key, await page.Locator("h1").InnerTextAsync());
        // Hand count: 30 loop-hours with samples, 23 healthy = 76.7 %; the week before 10 of 10 = 100 %, so -23.3 points.
        var healthy = await page.Locator("tr[data-figure=healthy]").InnerTextAsync();
        Assert.Contains("76.7 %", healthy);
        Assert.Contains("(23 of 30)", healthy);
        Assert.Contains("100.0 %", healthy);
        Assert.Contains("−23.3 pts", healthy);
        var loops = await page.Locator("tr[data-figure=loops]").InnerTextAsync();
        Assert.Contains("2", loops);
        Assert.Contains("+1", loops);
        // By area: North yard 15 of 20 = 75.0 %, South yard 8 of 10 = 80.0 %.
        Assert.Contains("75.0 %", await page.Locator("tr[data-area='North yard']").InnerTextAsync());
        Assert.Contains("80.0 %", await page.Locator("tr[data-area='South yard']").InnerTextAsync());
        Assert.Contains("2.5 h", await page.Locator("#top-oscillating tr[data-loop='FIC-990']").InnerTextAsync()); // 5 × 1,800 s
        Assert.Contains("0.5 h", await page.Locator("#top-offset tr[data-loop='PIC-991']").InnerTextAsync());     // 2 × 900 s
        var reversals = await page.Locator("#top-reversals tbody tr").AllInnerTextsAsync();
        Assert.Equal(2, reversals.Count);
        Assert.Contains("PIC-991", reversals[0]); // 3,000 before 400
        Assert.Contains("3,000", reversals[0]);
        await Chromium.ShotAsync(page, "weekly");

        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("#csv"));
        Assert.Equal($"loopwatch-week-{week.Key}.csv", download.SuggestedFilename);
        var lines = (await File.ReadAllTextAsync((await download.PathAsync())!)).Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(3, lines.Length); // header and one row per loop
        Assert.Equal(string.Join(',', WeeklyCsv.Columns), lines[0]);
        Assert.Equal($"{week.Key},FIC-990,North yard,20,15,75.0,2.50,0.00,400,2.50,0.00,0.00", lines[1]);
        Assert.Equal($"{week.Key},PIC-991,South yard,10,8,80.0,0.00,0.50,3000,0.50,0.00,0.00", lines[2]);

        // Printable on A4: the print style hides navigation and links; Chromium renders the PDF at the CSS page size.
        await page.EmulateMediaAsync(new() { Media = Media.Print });
        Assert.False(await page.Locator("header.bar").IsVisibleAsync());
        Assert.False(await page.Locator("#csv").IsVisibleAsync());
        var pdf = await page.PdfAsync(new() { PreferCSSPageSize = true });
        // ISO 216 A4 is 210 × 297 mm = 595 × 842 PostScript points.
        var pdfText = System.Text.Encoding.Latin1.GetString(pdf);
        File.WriteAllBytes(Path.Combine(Chromium.ArtefactDir, "weekly.pdf"), pdf);
        Assert.Matches(@"/MediaBox \[0 0 59[45](\.\d+)? 84[12](\.\d+)?\]", pdfText);
        await page.EmulateMediaAsync(new() { Media = Media.Screen });

        // Without a week: the last complete week of plant time.
        await page.GotoAsync(agent.Http.BaseAddress + "weekly");
        var last = ReportWeek.LastComplete(services.GetRequiredService<IPlantView>().Now, TimeZoneInfo.Utc);
        Assert.Contains(last.Key, await page.Locator("h1").InnerTextAsync());

        using var http = PageRig.Client(agent);
        var csv = await http.GetAsync($"/weekly?handler=Csv&week={week.Monday.AddDays(3).ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)}");
        Assert.Equal("text/csv", csv.Content.Headers.ContentType!.MediaType);
        Assert.Contains("FIC-990", await csv.Content.ReadAsStringAsync()); // a mid-week date snaps to its Monday
        Assert.Equal(System.Net.HttpStatusCode.BadRequest, (await http.GetAsync("/weekly?week=last-tuesday")).StatusCode);
    }

    [Fact]
    public async Task With_the_other_shards_databases_the_weekly_page_covers_the_whole_plant_and_names_a_database_it_cannot_read()
    {
        // Two loops in one configuration, one per shard of two (the documented FNV-1a hash picks the shard).
        var ids = new[] { "FIC-990", "PIC-991", "LIC-992", "TIC-993", "FIC-994" };
        var mine = ids.First(i => Agent.Configuration.ShardOptions.ShardOf(i, 2) == 0);
        var theirs = ids.First(i => Agent.Configuration.ShardOptions.ShardOf(i, 2) == 1);
        var north = TestLoops.Pid(mine);
        north.Area = "North yard";
        var south = TestLoops.Pid(theirs);
        south.Area = "South yard";
        var week = ReportWeek.LastComplete(DateTimeOffset.UtcNow, TimeZoneInfo.Utc).Before();
        var h0 = week.Start.ToUnixTimeMilliseconds();

        // The other agent's database, written by its own writer and closed, as a stopped or running shard leaves it.
        var other = Path.Combine(Directory.CreateTempSubdirectory("lw-shard-1-").FullName, "loopwatch.db");
        // 10 hours, 4 of them with an offset.
        await ShardDatabase.WriteAsync(other, theirs, h0, hours: 10, offsetHours: 4);
        var before = await File.ReadAllBytesAsync(other);
        var missing = Path.Combine(Path.GetTempPath(), $"lw-shard-2-{Guid.NewGuid():N}", "loopwatch.db");

        await using var agent = await RunningAgent.StartAsync([north, south], embedded: true, brokerPort: FreePort.Next(), tweak: o =>
        {
            o.Shard = new Agent.Configuration.ShardOptions { Index = 0, Count = 2 };
            o.Dashboard.WeeklyDatabases = [other, missing];
        });
        Assert.Equal([mine], (await agent.LoopsAsync()).EnumerateArray().Select(l => l.GetProperty("id").GetString()!).ToArray());
        var writer = agent.App.Services.GetRequiredService<AgentStorage>().Writer;
        // 20 hours, all healthy.
        for (var h = 0; h < 20; h++) writer.Post(new HourlyStatsRow { LoopId = mine, HourMs = h0 + h * HourMs, Samples = 3600, SecondsAnyFinding = 0 });
        await PageRig.FlushAsync(agent);

        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();
        await page.GotoAsync(agent.Http.BaseAddress + "weekly?week=" + week.Key);
        Assert.Contains("merged from 2 agents' databases", await page.Locator("p.quiet").First.InnerTextAsync());
        var notIncluded = await page.Locator("#not-included").InnerTextAsync();
        Assert.Contains(missing, notIncluded);
        Assert.Contains("not found", notIncluded);
        // Hand count: 30 loop-hours, 26 healthy = 86.7 %; by area 20 of 20 and 6 of 10, the South yard known from the
        // configuration although this agent does not watch its loop.
        Assert.Contains("(26 of 30)", await page.Locator("tr[data-figure=healthy]").InnerTextAsync());
        Assert.Contains("100.0 %", await page.Locator("tr[data-area='North yard']").InnerTextAsync());
        Assert.Contains("60.0 %", await page.Locator("tr[data-area='South yard']").InnerTextAsync());
        await Chromium.ShotAsync(page, "weekly-merged");

        // Read-only: the other agent's file is byte for byte as it was.
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Assert.Equal(before, await File.ReadAllBytesAsync(other));
    }
}

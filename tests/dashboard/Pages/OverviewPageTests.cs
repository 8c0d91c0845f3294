using LoopWatch.Agent.Demo;
using LoopWatch.Agent.Plant;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Dashboard.Tests.Infrastructure;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class OverviewPageTests
{
    [Fact]
    public async Task The_overview_lists_the_demo_loops_and_a_loop_page_draws_three_series()
    {
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync(new DemoPlant().Configuration, embedded: true, brokerPort: port,
            demo: new DemoRun(120, DateTimeOffset.Parse("2026-03-02T00:00:00Z")));
        await Eventually.Until(async () => (await agent.HealthAsync()).GetProperty("ingest").GetProperty("accepted").GetInt64(), n => n > 2000,
            what: "demo data flowing");
        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();
        await page.GotoAsync(agent.Http.BaseAddress + "");
        var rows = await page.Locator("#loops tbody tr").CountAsync();
        Assert.Equal(new DemoPlant().Configuration.Count, rows);
        Assert.Contains("FIC-101", await page.Locator("#loops").InnerTextAsync());
        await Chromium.ShotAsync(page, "overview");

        await page.Locator("#loops a", new() { HasText = "TIC-202" }).ClickAsync();
        await page.WaitForURLAsync("**/loop?id=TIC-202");
        var series = page.Locator("svg.trend polyline.series");
        Assert.Equal(3, await series.CountAsync());
        var pv = await page.Locator("svg.trend polyline[data-series=pv]").GetAttributeAsync("points");
        Assert.True(pv!.Split(' ', StringSplitOptions.RemoveEmptyEntries).Length > 10, "the PV series has points");
        await Chromium.ShotAsync(page, "loop-TIC-202");
    }

    [Fact]
    public async Task Markup_in_a_loop_id_and_description_is_shown_as_text()
    {
        var hostile = new LoopOptions
        {
            Id = "FIC-<script>alert(1)</script>\"'", Description = "<b>bold</b> & \"quoted\" <img src=x onerror=alert(2)>", Area = "<i>area</i>",
            Kind = "pid", Process = "flow",
            Pv = new SignalOptions { Tag = "h/pv", Min = 0, Max = 10, Unit = "<u>m3/h</u>" },
            Sp = new SignalOptions { Tag = "h/sp" }, Op = new SignalOptions { Tag = "h/op" },
        };
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync([hostile], embedded: true, brokerPort: port);
        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();
        var dialogs = 0;
        page.Dialog += (_, d) => { dialogs++; _ = d.DismissAsync(); };
        await page.GotoAsync(agent.Http.BaseAddress + "");
        var text = await page.Locator("#loops").InnerTextAsync();
        Assert.Contains(hostile.Id, text);
        Assert.Contains(hostile.Description, text);
        Assert.Equal(0, await page.Locator("#loops b, #loops img, #loops i, #loops script").CountAsync());

        await page.GotoAsync(agent.Http.BaseAddress + "loop?id=" + Uri.EscapeDataString(hostile.Id));
        Assert.Contains(hostile.Id, await page.Locator("h1").InnerTextAsync());
        var svgText = await page.Locator("svg.trend text").AllTextContentsAsync();
        Assert.Contains("<u>m3/h</u>", svgText); // the unit label in the SVG stays text
        Assert.Equal(0, await page.Locator("svg.trend u").CountAsync());
        Assert.Equal(0, dialogs);
        await Chromium.ShotAsync(page, "hostile-names");
    }
}

using LoopWatch.Agent.Storage;
using LoopWatch.Dashboard.Model;
using LoopWatch.Dashboard.Reports;
using LoopWatch.Dashboard.Tests.Infrastructure;
using LoopWatch.Storage.Rows;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class ShiftPageTests
{
    [Fact]
    public async Task The_handover_shows_this_shifts_alarms_and_comments_and_the_previous_shift_on_request()
    {
        await using var agent = await PageRig.StartWithStaleAlarmsAsync(PageRig.FastStale("FIC-982", area: "Filter house"));
        var services = agent.App.Services;
        var alarms = services.GetRequiredService<IAlarmView>();
        Assert.True(alarms.Acknowledge("FIC-982:stale", "op.three", "gateway power cycled").Accepted);

        // A note in the previous shift, written through the agent's own storage writer.
        var schedule = services.GetRequiredService<ShiftSchedule>();
        var current = schedule.At(services.GetRequiredService<IPlantView>().Now);
        var previous = schedule.Previous(current);
        services.GetRequiredService<AgentStorage>().Writer.Post(new AlarmJournalEntry(previous.Start.AddMinutes(5).ToUnixTimeMilliseconds(),
            "FIC-982", "offset", "low", "normal", "unacknowledged", User: null, Comment: null));
        services.GetRequiredService<AgentStorage>().Writer.Post(new AlarmJournalEntry(previous.Start.AddMinutes(9).ToUnixTimeMilliseconds(),
            "FIC-982", "offset", "low", "unacknowledged", "acknowledged", User: "op.night", Comment: "offset after pump change-over"));
        await PageRig.FlushAsync(agent);

        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();
        await page.GotoAsync(agent.Http.BaseAddress + "shift");
        Assert.Contains(current.Label, await page.Locator(".shift-when").InnerTextAsync());
        Assert.Equal("1", await page.Locator("#raised-count").TextContentAsync());
        Assert.Contains("FIC-982", await page.Locator("#raised").InnerTextAsync());
        Assert.Contains("gateway power cycled", await page.Locator("#comments").InnerTextAsync());
        Assert.Contains("op.three", await page.Locator("#comments").InnerTextAsync());
        var change = await page.Locator("#changes tr[data-loop='FIC-982'][data-kind='stale']").InnerTextAsync();
        Assert.Contains("Filter house", change);
        Assert.Contains("normal", change); // state at shift start
        Assert.DoesNotContain("offset after pump change-over", await page.Locator("main").InnerTextAsync());
        Assert.Contains("FIC-982", await page.Locator("#handover").InnerTextAsync());
        await Chromium.ShotAsync(page, "shift-current");

        await page.ClickAsync("a[href='/shift?shift=previous']");
        // Waits on the new page's content, not on a load event (once missed on a loaded machine, timing out after 120 s).
        await Microsoft.Playwright.Assertions.Expect(page.Locator(".shift-when")).ToContainTextAsync(previous.Label, new() { Timeout = 120_000 });
        Assert.EndsWith("/shift?shift=previous", page.Url);
        Assert.Contains("offset after pump change-over", await page.Locator("#comments").InnerTextAsync());
        Assert.DoesNotContain("gateway power cycled", await page.Locator("main").InnerTextAsync());
        Assert.Equal(0, await page.Locator("#handover").CountAsync());

        // Printable: the print style sheet hides the navigation and the links, keeps the report.
        await page.EmulateMediaAsync(new() { Media = Media.Print });
        Assert.False(await page.Locator("header.bar").IsVisibleAsync());
        Assert.True(await page.Locator("#comments").IsVisibleAsync());
        await Chromium.ShotAsync(page, "shift-previous-print");

        using var http = PageRig.Client(agent);
        Assert.Equal(System.Net.HttpStatusCode.BadRequest, (await http.GetAsync("/shift?shift=tomorrow")).StatusCode);
    }
}

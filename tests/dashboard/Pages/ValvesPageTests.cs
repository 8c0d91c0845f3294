using System.Net;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Dashboard.Access;
using LoopWatch.Dashboard.Tests.Infrastructure;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class ValvesPageTests
{
    /// <summary>Twenty periods of a 30-70 % triangle on the output (60 s period), through the agent's own ingest path.</summary>
    private static async Task<RunningAgent> AgentWithTriangleAsync()
    {
        var agent = await RunningAgent.StartAsync([TestLoops.Pid("FV-960")], embedded: true, brokerPort: FreePort.Next());
        TriangleFeed.Run(agent.App.Services.GetRequiredService<PlantState>(), "FV-960", 1200);
        return agent;
    }

    [Fact]
    public async Task Maintenance_sees_the_counts_records_a_service_and_the_old_period_is_kept()
    {
        await using var agent = await AgentWithTriangleAsync();
        await PageRig.AddUserAsync(agent, "mae", Roles.Maintenance);
        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();
        await PageRig.SignInAsync(page, agent, "mae", "/valves");
        var row = page.Locator("tr[data-valve='FV-960/op']");
        // Geometry: a triangle turns twice a period; 20 periods from a rising start give 39 confirmed reversals, and
        // travel of 40 % up and 40 % down per period, 20 x 80 % = 16 strokes (exact).
        var cells = await row.Locator("td").AllInnerTextsAsync();
        Assert.Equal("39", cells[4]);
        Assert.Equal("16.00", cells[5]);
        Assert.Equal(8, await row.Locator("svg.bars rect").CountAsync()); // 8 bins of the rainflow histogram
        await Chromium.ShotAsync(page, "valves");

        await row.Locator("input[name=note]").FillAsync("repacked stem, <b>new</b> positioner");
        await row.Locator("button[type=submit]").ClickAsync();
        await page.WaitForSelectorAsync("p.notice");
        cells = await page.Locator("tr[data-valve='FV-960/op'] td").AllInnerTextsAsync();
        Assert.Equal("0", cells[4]);
        await Chromium.ShotAsync(page, "valves-after-service");

        var storage = agent.App.Services.GetRequiredService<AgentStorage>();
        await storage.Writer.FlushAsync();
        var periods = await storage.Reader.ReadPeriodsAsync("FV-960", "op");
        Assert.Contains(periods, p => p.Reversals == 39);
        var service = Assert.Single(await storage.Reader.ReadServiceRecordsAsync("FV-960"));
        Assert.Equal("mae", service.User);
        Assert.Equal("repacked stem, <b>new</b> positioner", service.Note);
    }

    [Fact]
    public async Task Recording_a_service_is_refused_without_login_without_token_and_for_an_operator()
    {
        await using var agent = await AgentWithTriangleAsync();
        await PageRig.AddUserAsync(agent, "ria", Roles.Operator);
        var form = new Dictionary<string, string> { ["loop"] = "FV-960", ["element"] = "op", ["note"] = "x" };

        using (var anonymous = PageRig.Client(agent))
        {
            var token = await PageRig.TokenAsync(anonymous, "/login");
            var r = await anonymous.PostAsync("/valves?handler=Service", new FormUrlEncodedContent(new Dictionary<string, string>(form) { ["__RequestVerificationToken"] = token }));
            Assert.Equal(HttpStatusCode.Redirect, r.StatusCode);
            Assert.Contains("/login", r.Headers.Location!.ToString());
        }
        using var op = PageRig.Client(agent);
        await PageRig.SignInAsync(op, "ria");
        Assert.Equal(HttpStatusCode.BadRequest, (await op.PostAsync("/valves?handler=Service", new FormUrlEncodedContent(form))).StatusCode);
        var opToken = await PageRig.TokenAsync(op, "/valves");
        var refused = await op.PostAsync("/valves?handler=Service", new FormUrlEncodedContent(new Dictionary<string, string>(form) { ["__RequestVerificationToken"] = opToken }));
        Assert.Equal(HttpStatusCode.Forbidden, refused.StatusCode);
        var storage = agent.App.Services.GetRequiredService<AgentStorage>();
        await storage.Writer.FlushAsync();
        Assert.Empty(await storage.Reader.ReadServiceRecordsAsync("FV-960"));
    }
}

using System.Globalization;
using System.Text.RegularExpressions;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Plant;
using LoopWatch.Agent.Storage;
using LoopWatch.Storage.Rows;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Advice;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Dashboard.Tests.Infrastructure;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed partial class AdvicePageTests
{
    private static readonly long T0 = new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero).UtcTicks;

    /// <summary>The demo plant simulated for <paramref name="seconds"/> and fed through the agent's own ingest path in event time.</summary>
    private static void FeedDemo(PlantState state, int seconds)
    {
        var plant = new DemoPlant();
        for (var s = 1; s <= seconds; s++)
        {
            plant.Step();
            var ticks = T0 + s * TimeSpan.TicksPerSecond;
            foreach (var loop in plant.Loops)
            {
                var o = loop.Options;
                var r = loop.Reading;
                void Take(string? tag, double v) { if (tag is not null && !double.IsNaN(v)) state.Take(state.Routes[tag], ticks, v, SampleQuality.Good); }
                Take(o.Pv!.Tag, r.Pv);
                Take(o.Sp?.Tag, r.Sp);
                Take(o.Mode?.Tag, (double)r.Mode);
                Take(o.Position?.Tag, r.Position);
                Take(o.Op!.Tag, r.Op);
            }
        }
    }

    private static double Num(Match m, int group) => double.Parse(m.Groups[group].Value, CultureInfo.InvariantCulture);

    [Fact]
    public async Task The_loop_page_shows_worked_advice_with_the_caution_and_its_numbers_redo_by_hand()
    {
        await using var agent = await RunningAgent.StartAsync(new DemoPlant().Configuration, embedded: true, brokerPort: FreePort.Next());
        // 52 min: past the set-point test and the load change of PIC-201 (15 min) and a full 30 min routine window after them.
        FeedDemo(agent.App.Services.GetRequiredService<PlantState>(), 3100);
        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();

        await page.GotoAsync(agent.Http.BaseAddress + "loop?id=LIC-301");
        var sump = await page.Locator("#advice section[data-adviser=dead-zone]").InnerTextAsync();
        Assert.Contains("Dead-zone sizing", sump);
        Assert.Contains(AdviceCaution.Text, sump);
        var d = WorkedAdvice.CycleRedoes(sump); // the page's cycle-time line redone by hand
        await Chromium.ShotAsync(page, "advice-LIC-301");

        await page.GotoAsync(agent.Http.BaseAddress + "loop?id=PIC-201");
        var offset = await page.Locator("#advice section[data-adviser=offset-what-if]").InnerTextAsync();
        Assert.Contains(AdviceCaution.Text, offset);
        Assert.Contains("Only integral action removes the offset", offset);
        // Load effect = offset × (1 + Kc Kp), as printed (Seborg, Edgar and Mellichamp's P-only offset formula turned round).
        var load = LoadLine().Match(offset);
        Assert.True(load.Success, offset);
        Assert.Equal(Num(load, 1) * (1 + Num(load, 2) * Num(load, 3)), Num(load, 4), 2e-3 * Num(load, 4));
        Assert.Equal(5, await page.Locator("#advice table.what-if tbody tr").CountAsync());
        var harris = await page.Locator("#advice section[data-adviser=performance]").InnerTextAsync();
        Assert.Contains(AdviceCaution.Text, harris);
        // Index = 1 - sigma_mv² / sigma_y² (Harris 1989), as printed.
        var index = IndexLine().Match(harris);
        Assert.True(index.Success, harris);
        Assert.Equal(1 - Math.Pow(Num(index, 1) / Num(index, 2), 2), Num(index, 3), 2e-3);
        await Chromium.ShotAsync(page, "advice-PIC-201");

        // The same figures in /api/loops, under each loop's stats.
        var json = await agent.LoopAsync("LIC-301");
        var dz = json!.Value.GetProperty("stats").GetProperty("advice").GetProperty("dead_zone");
        Assert.Equal(d, dz.GetProperty("dead_zone").GetDouble());
        Assert.Equal(AdviceCaution.Text, dz.GetProperty("caution").GetString());
        // A loop without a dead time says why it has no index.
        var fic = await agent.LoopAsync("FIC-101");
        Assert.Contains("Tuning:DeadTimeSeconds", fic!.Value.GetProperty("stats").GetProperty("advice").GetProperty("performance").GetProperty("not_shown_because").GetString());

        // The weekly summary lists a top offender of the week with the advice its loop has now, caution beside it.
        var writer = agent.App.Services.GetRequiredService<AgentStorage>().Writer;
        writer.Post(new HourlyStatsRow { LoopId = "LIC-301", HourMs = new DateTimeOffset(T0, TimeSpan.Zero).AddHours(-1).ToUnixTimeMilliseconds(), Samples = 3600, SecondsAnyFinding = 3600 });
        await writer.FlushAsync();
        await page.GotoAsync(agent.Http.BaseAddress + "weekly?week=2026-03-02");
        var weekly = await page.Locator("#advice tr[data-loop=LIC-301]").InnerTextAsync();
        Assert.Contains($"dead zone {Rounding.Text(d)} m", weekly);
        Assert.Contains(AdviceCaution.Text, weekly);
    }

    [GeneratedRegex(@"= (-?[0-9]+(?:\.[0-9]+)?) × \(1 \+ (-?[0-9]+(?:\.[0-9]+)?) × (-?[0-9]+(?:\.[0-9]+)?)\) = (-?[0-9]+(?:\.[0-9]+)?) % of span")]
    private static partial Regex LoadLine();

    [GeneratedRegex(@"sigma_y² = 1 - (-?[0-9]+(?:\.[0-9]+)?)² / (-?[0-9]+(?:\.[0-9]+)?)² = (-?[0-9]+(?:\.[0-9]+)?)")]
    private static partial Regex IndexLine();
}

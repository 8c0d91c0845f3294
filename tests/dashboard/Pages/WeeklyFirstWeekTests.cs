using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Rows;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class WeeklyFirstWeekTests
{
    [Fact]
    public async Task Without_a_complete_week_the_default_summary_shows_the_week_so_far()
    {
        // A Wednesday noon, so the hour just finished lies in the current ISO week whatever day the test runs.
        var clock = new Microsoft.Extensions.Time.Testing.FakeTimeProvider(new DateTimeOffset(2026, 3, 4, 12, 0, 0, TimeSpan.Zero));
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-995")], embedded: true, brokerPort: FreePort.Next(), time: clock);
        var now = agent.App.Services.GetRequiredService<IPlantView>().Now;
        var writer = agent.App.Services.GetRequiredService<AgentStorage>().Writer;
        // One loop-hour just finished, healthy: the only data there is.
        var hour = now.ToUnixTimeMilliseconds() / 3_600_000 * 3_600_000 - 3_600_000;
        writer.Post(new HourlyStatsRow { LoopId = "FIC-995", HourMs = hour, Samples = 3600, SecondsAnyFinding = 0 });
        await writer.FlushAsync();

        var html = await agent.Http.GetStringAsync("/weekly");
        Assert.Contains("week not complete yet", html);
        Assert.Contains("(1 of 1)", html);
    }
}

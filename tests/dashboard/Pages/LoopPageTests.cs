using System.Text.RegularExpressions;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Storage.Rows;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed partial class LoopPageTests
{
    [Fact]
    public async Task The_day_trend_draws_the_stored_hourly_means_and_the_hour_trend_the_live_buffer()
    {
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FV-980")], embedded: true, brokerPort: FreePort.Next());
        // Live data moves the plant clock to the end of the triangle feed; hourly rows for the ten hours before it.
        TriangleFeed.Run(agent.App.Services.GetRequiredService<PlantState>(), "FV-980", 600);
        var end = new DateTimeOffset(TriangleFeed.T0, TimeSpan.Zero);
        var writer = agent.App.Services.GetRequiredService<AgentStorage>().Writer;
        for (var h = 1; h <= 10; h++)
            writer.Post(new HourlyStatsRow { LoopId = "FV-980", HourMs = end.AddHours(-h).ToUnixTimeMilliseconds(), Samples = 3600, PvMean = 100 + h, SpMean = 100, OpMean = 50 });
        writer.Post(new HourlyStatsRow { LoopId = "FV-980", HourMs = end.AddDays(-3).ToUnixTimeMilliseconds(), Samples = 3600, PvMean = 90, SpMean = 100, OpMean = 50 });
        await writer.FlushAsync();

        var day = await agent.Http.GetStringAsync("/loop?id=FV-980&span=day");
        Assert.Equal(10, PvPoints(day)); // the row three days back is outside the day
        var week = await agent.Http.GetStringAsync("/loop?id=FV-980&span=week");
        Assert.Equal(11, PvPoints(week));
        var hour = await agent.Http.GetStringAsync("/loop?id=FV-980");
        Assert.Equal(121, PvPoints(hour)); // 600 s of 5 s buckets from the live buffer, both ends included
        Assert.Contains("span-current", hour);
    }

    private static int PvPoints(string html) =>
        PvSeries().Match(html).Groups[1].Value.Split(' ', StringSplitOptions.RemoveEmptyEntries).Length;

    [GeneratedRegex("data-series=\"pv\"[^>]*points=\"([^\"]*)\"")]
    private static partial Regex PvSeries();
}

using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Agent.Valves;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Agent.Tests.Valves;

public sealed class ValveCounterRestartTests
{
    [Fact]
    public async Task Final_element_counters_survive_a_restart_of_the_agent()
    {
        var dir = Directory.CreateTempSubdirectory("lw-valves-").FullName;
        await using (var first = await RunningAgent.StartAsync([TestLoops.Pid("FV-970")], embedded: true, brokerPort: FreePort.Next(), dataDir: dir))
        {
            TriangleFeed.Run(first.App.Services.GetRequiredService<PlantState>(), "FV-970", 600);
            // Triangle geometry: 10 periods from a rising start give 19 confirmed reversals and 8 strokes (exact).
            var before = first.App.Services.GetRequiredService<ValveWear>().Valves().Single();
            Assert.Equal(19, before.ReversalsSinceService);
            Assert.Equal(800, before.TravelPctSinceService, 6);
        }
        await using var second = await RunningAgent.StartAsync([TestLoops.Pid("FV-970")], embedded: true, brokerPort: FreePort.Next(), dataDir: dir);
        var after = second.App.Services.GetRequiredService<ValveWear>().Valves().Single();
        Assert.Equal(19, after.ReversalsSinceService);
        Assert.Equal(800, after.TravelPctSinceService, 6);
        Assert.Equal(new DateTimeOffset(TriangleFeed.T0, TimeSpan.Zero), after.SinceService);
    }
}

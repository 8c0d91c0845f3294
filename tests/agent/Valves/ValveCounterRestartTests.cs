using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Agent.Valves;
using LoopWatch.Analytics.Sampling;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Agent.Tests.Valves;

public sealed class ValveCounterRestartTests
{
    [Fact]
    public async Task Final_element_counters_survive_a_restart_of_the_agent()
    {
        var dir = Directory.CreateTempSubdirectory("lw-valves-").FullName;
        var t0 = new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero).UtcTicks;
        await using (var first = await RunningAgent.StartAsync([TestLoops.Pid("FV-970")], embedded: true, brokerPort: FreePort.Next(), dataDir: dir))
        {
            var plant = first.App.Services.GetRequiredService<PlantState>();
            for (var s = 0; s <= 600; s++)
            {
                var ticks = t0 + s * TimeSpan.TicksPerSecond;
                var phase = s % 60;
                var op = phase < 30 ? 30 + 40 * phase / 30.0 : 70 - 40 * (phase - 30) / 30.0;
                plant.Take(plant.Routes["test/FV-970/pv"], ticks, 100, SampleQuality.Good);
                plant.Take(plant.Routes["test/FV-970/sp"], ticks, 100, SampleQuality.Good);
                plant.Take(plant.Routes["test/FV-970/op"], ticks, op, SampleQuality.Good);
            }
            // Triangle geometry: 10 periods from a rising start give 19 confirmed reversals and 8 strokes (exact).
            var before = first.App.Services.GetRequiredService<ValveWear>().Valves().Single();
            Assert.Equal(19, before.ReversalsSinceService);
            Assert.Equal(800, before.TravelPctSinceService, 6);
        }
        await using var second = await RunningAgent.StartAsync([TestLoops.Pid("FV-970")], embedded: true, brokerPort: FreePort.Next(), dataDir: dir);
        var after = second.App.Services.GetRequiredService<ValveWear>().Valves().Single();
        Assert.Equal(19, after.ReversalsSinceService);
        Assert.Equal(800, after.TravelPctSinceService, 6);
        Assert.Equal(new DateTimeOffset(t0, TimeSpan.Zero), after.SinceService);
    }
}

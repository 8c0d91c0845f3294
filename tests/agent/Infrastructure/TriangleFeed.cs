using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Feeds a test loop a steady PV at SP and a 30-70 % triangle output of 60 s period, through the agent's own ingest path.</summary>
public static class TriangleFeed
{
    public static readonly long T0 = new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero).UtcTicks;

    /// <summary>Seconds 0..<paramref name="seconds"/> inclusive; a rising start, so n whole periods give 2n - 1 reversals and 0.8 n strokes.</summary>
    public static void Run(PlantState plant, string loopId, int seconds, string root = "test")
    {
        for (var s = 0; s <= seconds; s++)
        {
            var ticks = T0 + s * TimeSpan.TicksPerSecond;
            var phase = s % 60;
            var op = phase < 30 ? 30 + 40 * phase / 30.0 : 70 - 40 * (phase - 30) / 30.0;
            plant.Take(plant.Routes[$"{root}/{loopId}/pv"], ticks, 100, SampleQuality.Good);
            plant.Take(plant.Routes[$"{root}/{loopId}/sp"], ticks, 100, SampleQuality.Good);
            plant.Take(plant.Routes[$"{root}/{loopId}/op"], ticks, op, SampleQuality.Good);
        }
    }
}

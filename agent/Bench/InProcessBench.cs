using System.Diagnostics;
using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Sampling;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// The analytics and alarm path alone: decoded values straight into <see cref="PlantState.Take"/> (loop state,
/// detectors, <see cref="AlarmFeed"/>) on one thread, no MQTT; the figure is updates per CPU second.
/// </summary>
internal static class InProcessBench
{
    /// <summary>Feeds round after round of every loop's three tags for the options' seconds.</summary>
    public static BenchResult Run(BenchOptions o, IReadOnlyList<LoopSpec> specs, ProcessGauge gauge)
    {
        var heapBefore = GC.GetTotalMemory(forceFullCollection: true);
        var engine = new AlarmEngine(specs);
        var time = TimeProvider.System;
        var plant = new PlantState(specs, new PlantClock(time), time, NullLogger<PlantState>.Instance, null,
            (spec, statistics) => [new AlarmFeed(engine.Loop(spec.Id)!, statistics)]);
        var routes = new TagRoute[o.Loops * BenchOptions.TagsPerLoop];
        for (var i = 0; i < o.Loops; i++)
            for (var t = 0; t < BenchOptions.TagsPerLoop; t++) routes[i * BenchOptions.TagsPerLoop + t] = plant.Routes[BenchPlant.Topic(i, t)];

        // Values computed once: the figure is the loop state's cost, not the generator's arithmetic.
        const int Pattern = 44; // the values repeat every 44 rounds (lcm of 11 and 4)
        var values = new double[Pattern][];
        for (var r = 0; r < Pattern; r++)
        {
            values[r] = new double[routes.Length];
            for (var k = 0; k < routes.Length; k++) values[r][k] = BenchPlant.Value(k / BenchOptions.TagsPerLoop, k % BenchOptions.TagsPerLoop, r);
        }

        long round = 0, slowestRound = -1;
        var slowest = TimeSpan.Zero;
        void Round()
        {
            var started = Stopwatch.GetTimestamp();
            var ticks = BenchPlant.Ticks(round);
            var v = values[round % Pattern];
            for (var k = 0; k < routes.Length; k++) plant.Take(routes[k], ticks, v[k], SampleQuality.Good);
            // The slowest round shows work done at once for every loop (the hourly statistics at a full hour).
            var took = Stopwatch.GetElapsedTime(started);
            if (took > slowest) (slowest, slowestRound) = (took, round);
            round++;
        }
        var warm = Stopwatch.StartNew();
        while (warm.Elapsed.TotalSeconds < Math.Min(5, o.Seconds / 5) || round < 2) Round();

        var firstRound = round;
        (slowest, slowestRound) = (TimeSpan.Zero, -1);
        gauge.Mark();
        var allocated = GC.GetTotalAllocatedBytes(precise: true);
        var clock = Stopwatch.StartNew();
        while (clock.Elapsed.TotalSeconds < o.Seconds) Round();
        var wall = clock.Elapsed.TotalSeconds;
        allocated = GC.GetTotalAllocatedBytes(precise: true) - allocated;
        var cpu = gauge.CpuSeconds();
        var cores = gauge.Cores();
        var updates = (double)(round - firstRound) * routes.Length;
        var heapAfter = GC.GetTotalMemory(forceFullCollection: true);
        GC.KeepAlive(plant);
        var typical = wall * 1000 / Math.Max(1, round - firstRound);
        Console.Error.WriteLine($"bench: {round - firstRound} rounds of {routes.Length:N0} updates, {typical:0.0} ms each on average; slowest {slowest.TotalMilliseconds:0.0} ms at event time {new DateTimeOffset(BenchPlant.Ticks(slowestRound), TimeSpan.Zero):HH:mm:ss}");
        return new BenchResult("in-process, one thread; processed = per CPU second", o.Loops, (long)updates, (long)updates, updates / wall, updates / Math.Max(cpu, 1e-9),
            null, null, 0, 0, null, null, cores, gauge.PeakRssMb, (heapAfter - heapBefore) / (double)o.Loops, cpu * 1e6 / updates, allocated / updates);
    }
}

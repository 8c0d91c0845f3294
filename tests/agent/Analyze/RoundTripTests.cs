using System.Text.Json;
using LoopWatch.Agent.Analyze;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Plant;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Dashboard.Api;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Extensions.Time.Testing;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Analyze;

public sealed class RoundTripTests
{
    private static IReadOnlyList<LoopSpec> Specs(IEnumerable<LoopOptions> loops)
    {
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check(loops.ToList(), errors);
        Assert.Empty(errors);
        return specs;
    }

    private static string Json(object o) => JsonSerializer.Serialize(o, ApiJson.Options);

    [Fact]
    public void Long_wide_and_gzipped_files_give_the_findings_and_statistics_of_values_fed_to_plant_state_directly()
    {
        // 40 simulated minutes of the whole demo plant: an offset, short cycling, stiction, aggressive tuning, manual periods.
        var plant = new DemoPlant(seed: 7);
        var rec = PlantRecording.Of(plant.Loops, seconds: 2400);
        var specs = Specs(rec.Loops);

        // The live path by hand: decode each value as a payload, Take it, and tick every loop once per new second of event time.
        var time = new FakeTimeProvider(PlantRecording.Start);
        var changes = new List<FindingChange>();
        var collector = new FindingCollector();
        var accumulators = new Dictionary<string, SpanAccumulator>();
        var live = new PlantState(specs, new PlantClock(time), time, NullLogger<PlantState>.Instance, c => { changes.Add(c); collector.Take(c); },
            (s, _) => [accumulators[s.Id] = new SpanAccumulator(s)]);
        long second = 0;
        foreach (var (at, tag, value) in rec.Values)
        {
            if (at.UtcTicks / TimeSpan.TicksPerSecond > second)
            {
                if (second != 0) live.AdvanceTo(at.UtcTicks);
                second = at.UtcTicks / TimeSpan.TicksPerSecond;
            }
            var route = live.Routes[tag];
            Assert.Equal(RejectReason.None, PayloadDecoder.Decode(System.Text.Encoding.UTF8.GetBytes(value), route.ValueKind, out var v));
            live.Take(route, at.UtcTicks, v.Value, SampleQuality.Good);
        }
        var expectedFindings = Json(specs.ToDictionary(s => s.Id, s => collector.For(s.Id).Select(f => (object)f).ToList()));
        var expectedStats = Json(specs.Select(s => accumulators[s.Id].Figures()).ToList());
        var expectedWindow = Json(live.Loops().Select(l => l.Statistics).ToList());
        Assert.Contains(changes, c => c.Finding.Kind == FindingKinds.SustainedOffset); // PIC-201's proportional-only offset is there to compare

        using var run = new AnalyzeRun();
        var files = new[]
        {
            new[] { run.File("plant-long.csv", rec.LongCsv()) },
            new[] { run.File("plant-wide.csv", rec.WideCsv()) },
            new[] { Gz(run, "plant-long.csv.gz", rec.LongCsv()) },
        };
        foreach (var set in files)
        {
            var result = new OfflineAnalysis(specs).Run(set);
            Assert.Equal(0, result.Rejects.Rows);
            var byId = result.Loops.ToDictionary(l => l.Spec.Id);
            // Raised and ended findings per loop in the order they happened, each with its final figures.
            Assert.Equal(expectedFindings, Json(specs.ToDictionary(s => s.Id, s => byId[s.Id].Findings.Select(f => (object)f).ToList())));
            Assert.Equal(expectedStats, Json(specs.Select(s => byId[s.Id].Stats).ToList()));
            Assert.Equal(expectedWindow, Json(specs.Select(s => byId[s.Id].WindowStats).ToList()));
        }
    }

    private static string Gz(AnalyzeRun run, string name, string text)
    {
        var path = run.PathOf(name);
        PlantRecording.WriteGz(path, text);
        return path;
    }
}

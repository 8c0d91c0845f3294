using System.Text;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using Microsoft.Extensions.Logging.Testing;
using Microsoft.Extensions.Time.Testing;

namespace LoopWatch.Agent.Tests.Ingest;

/// <summary>
/// Hostile payloads through the real decoder and loop state (<see cref="PlantState.Ingest"/> -> <c>PlantState.Take</c>
/// -> <c>LoopMonitor</c>), interleaved with a healthy simulated PI flow loop stamped by its gateway.
/// </summary>
public sealed class PayloadFuzzTests
{
    private static readonly DateTimeOffset Start = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);
    private const int Seconds = 2 * 3600;
    private const int HostilePerSecond = 10;
    private const int NoisePerSecond = 5;

    /// <summary>How many generated payloads the fuzz run sends (the README's Reliability table quotes it).</summary>
    public const int Generated = Seconds * (HostilePerSecond + NoisePerSecond);

    private sealed record Run(PlantState Plant, List<FindingChange> Changes, long AllocatedBytes, long Payloads,
        Dictionary<RejectReason, long> Expected, long ExpectedLate, List<string> Mismatches, FakeLogCollector Logs);

    [Fact]
    public void Over_100000_hostile_payloads_are_each_rejected_by_reason_or_dropped_as_late_and_change_nothing_on_a_healthy_loop()
    {
        var clean = Feed(hostile: false);
        var run = Feed(hostile: true);
        Assert.True(Generated >= 100_000, $"{Generated} generated payloads");

        // Every hostile payload got the outcome the payload rules in the README promise.
        Assert.True(run.Mismatches.Count == 0, string.Join("\n", run.Mismatches.DistinctBy(m => m[..m.IndexOf(':')]).Take(20)));
        foreach (var (reason, count) in run.Expected) Assert.Equal(count, run.Plant.RejectedFor(reason));
        var counters = run.Plant.Counters();
        Assert.Equal(counters.Received, counters.Accepted + counters.Rejected);
        Assert.Equal(run.Payloads, counters.Received);
        Assert.Equal(counters.Rejected, Enum.GetValues<RejectReason>().Sum(run.Plant.RejectedFor));

        // The healthy loop saw exactly what it saw without the garbage: the same samples, statistics and findings (none).
        var healthy = run.Plant.Cell("FIC-601")!;
        var reference = clean.Plant.Cell("FIC-601")!;
        var snap = healthy.Read(m => m.Snapshot);
        var refSnap = reference.Read(m => m.Snapshot);
        Assert.Equal(refSnap.Samples, snap.Samples);
        Assert.Equal(Seconds, snap.Samples);
        Assert.Equal(refSnap with { LateValues = 0 }, snap with { LateValues = 0 });
        Assert.Equal(run.ExpectedLate, snap.LateValues - refSnap.LateValues);
        Assert.Equal(reference.Read(m => m.Statistics()), healthy.Read(m => m.Statistics()));
        Assert.Empty(clean.Changes);
        Assert.DoesNotContain(run.Changes, c => c.LoopId == "FIC-601");

        // Memory stays bounded: ingest allocates nothing per payload but the rate-limited log lines and, for malformed
        // JSON, the exception the JSON reader throws (about 2.5 KB, dropped at once), so nothing per payload can be
        // retained; the trend holds its fixed 720 buckets and no route is added for what arrives.
        var badJson = run.Plant.RejectedFor(RejectReason.BadJson);
        Assert.True(run.AllocatedBytes < run.Payloads * 4 + badJson * 4096, $"{run.AllocatedBytes} bytes allocated for {run.Payloads} payloads, {badJson} malformed JSON");
        Assert.InRange(healthy.Trend(0).Count, 1, 720);
        Assert.Equal(8, run.Plant.Routes.Count);

        // Rejections are logged at most once per 10 s of receive time, and at least once.
        var rejectLines = run.Logs.GetSnapshot().Count(r => r.Id.Id == 1001);
        Assert.InRange(rejectLines, 1, Seconds / 10 + 1);
    }

    [Fact]
    public void A_gateway_clock_that_jumps_back_an_hour_drops_its_values_as_late_shows_stale_and_resumes_without_another_finding()
    {
        var time = new FakeTimeProvider(Start);
        var changes = new List<FindingChange>();
        var plant = new PlantState(Specs(), new PlantClock(time), time, new FakeLogger<PlantState>(), changes.Add);
        var model = Model();
        const int jumpAt = 3600, end = 3 * 3600;
        for (var s = 0; s < end; s++)
        {
            time.SetUtcNow(Start.AddSeconds(s + 0.25));
            model.Step(s, 1);
            // From jumpAt on the gateway stamps its values an hour behind the receive time.
            var stamp = Start.AddSeconds(s < jumpAt ? s : s - 3600);
            foreach (var (tag, payload) in Healthy(model, stamp)) plant.Ingest(tag, payload);
            plant.AdvanceAll();
        }
        var snap = plant.Cell("FIC-601")!.Read(m => m.Snapshot);
        // Stamps Start+0 .. Start+3598 lie before the newest interval taken (Start+3599): 3599 seconds of four tags.
        Assert.Equal(3599 * 4, snap.LateValues);
        Assert.Equal(end - 3600, snap.Samples);
        var loop = changes.Where(c => c.LoopId == "FIC-601").ToList();
        Assert.Equal(["raised stale", "ended stale"], loop.Select(c => $"{c.Change.ToString().ToLowerInvariant()} {c.Finding.Kind}"));
        // Raised once StaleSeconds (30) of plant time passed without a usable value, ended by the first value past the old newest time.
        Assert.Equal(Start.AddSeconds(3599), loop[0].Finding.Start);
        Assert.False(plant.Cell("FIC-601")!.Read(m => m.IsStale));
    }

    private static Run Feed(bool hostile)
    {
        var time = new FakeTimeProvider(Start);
        var changes = new List<FindingChange>();
        var logs = new FakeLogCollector();
        var plant = new PlantState(Specs(), new PlantClock(time), time, new FakeLogger<PlantState>(logs), changes.Add);
        var model = Model();
        var generator = new HostilePayloads(seed: 8);
        var expected = new Dictionary<RejectReason, long>();
        var mismatches = new List<string>();
        long allocated = 0, payloads = 0, late = 0;
        string[] hostileTags = ["quillmoor/FIC-601/pv", "quillmoor/FIC-601/sp", "quillmoor/FIC-601/op"];
        string[] noiseTags = ["quillmoor/FIC-602/pv", "quillmoor/FIC-602/sp", "quillmoor/FIC-602/op", "quillmoor/FIC-602/mode"];
        var pick = new Random(9);

        RejectReason Ingest(string topic, ReadOnlySpan<byte> payload)
        {
            var before = GC.GetAllocatedBytesForCurrentThread();
            var reason = plant.Ingest(topic, payload);
            allocated += GC.GetAllocatedBytesForCurrentThread() - before;
            payloads++;
            return reason;
        }

        for (var s = 0; s < Seconds; s++)
        {
            var stamp = Start.AddSeconds(s);
            time.SetUtcNow(stamp.AddSeconds(0.25));
            model.Step(s, 1);
            var latest = "";
            foreach (var (tag, payload) in Healthy(model, stamp))
            {
                Ingest(tag, payload);
                if (tag.EndsWith("/pv", StringComparison.Ordinal)) latest = Encoding.UTF8.GetString(payload);
            }
            if (hostile)
            {
                for (var i = 0; i < HostilePerSecond; i++)
                {
                    var c = generator.Next(stamp.UtcTicks, latest);
                    var tag = c.Kind == "duplicate" ? hostileTags[0] : hostileTags[pick.Next(hostileTags.Length)];
                    var got = Ingest(tag, c.Payload.AsSpan(0, c.Length));
                    if (got != c.Expected)
                        mismatches.Add($"{c.Kind}: expected {c.Expected}, got {got}: {Encoding.UTF8.GetString(c.Payload, 0, Math.Min(c.Length, 120))}");
                    if (got != RejectReason.None) expected[got] = expected.GetValueOrDefault(got) + 1;
                    if (c.Late) late++;
                }
                for (var i = 0; i < NoisePerSecond; i++)
                {
                    var got = Ingest(noiseTags[pick.Next(noiseTags.Length)], generator.Noise(latest));
                    if (got != RejectReason.None) expected[got] = expected.GetValueOrDefault(got) + 1;
                }
            }
            plant.AdvanceAll();
        }
        return new Run(plant, changes, allocated, payloads, expected, late, mismatches, logs);
    }

    private static IEnumerable<(string Tag, byte[] Payload)> Healthy(PidLoopModel model, DateTimeOffset stamp)
    {
        var r = model.Reading;
        var ts = HostilePayloads.Iso(stamp);
        string Json(double v) => $$"""{"value":{{Math.Round(v, 4).ToString("R", System.Globalization.CultureInfo.InvariantCulture)}},"timestamp":"{{ts}}"}""";
        yield return ("quillmoor/FIC-601/pv", Encoding.UTF8.GetBytes(Json(r.Pv)));
        yield return ("quillmoor/FIC-601/sp", Encoding.UTF8.GetBytes(Json(r.Sp)));
        yield return ("quillmoor/FIC-601/op", Encoding.UTF8.GetBytes(Json(r.Op)));
        yield return ("quillmoor/FIC-601/mode", Encoding.UTF8.GetBytes($$"""{"value":"auto","timestamp":"{{ts}}"}"""));
    }

    // Flow loop, Kc 0.5 and Ti 8 s on a 5 s lag with 0.15 % of span transmitter noise: healthy, as in NoFalseFindingsTests.
    private static PidLoopModel Model() => new(Loop("FIC-601"), new PidLoopSetup
    {
        Kc = 0.5, TiSeconds = 8, TauSeconds = 5, DeadTimeSeconds = 1, NoiseSigmaPct = 0.15, Seed = 11,
    });

    private static IReadOnlyList<LoopSpec> Specs()
    {
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check([Loop("FIC-601"), Loop("FIC-602")], errors);
        Assert.Empty(errors);
        return specs;
    }

    private static LoopOptions Loop(string id) => new()
    {
        Id = id, Description = "Quillmoor raw water flow", Area = "Intake", Kind = "pid", Process = "flow",
        Pv = new SignalOptions { Tag = $"quillmoor/{id}/pv", Min = 0, Max = 250, Unit = "m3/h" },
        Sp = new SignalOptions { Tag = $"quillmoor/{id}/sp" },
        Op = new SignalOptions { Tag = $"quillmoor/{id}/op" },
        Mode = new SignalOptions { Tag = $"quillmoor/{id}/mode" },
    };
}

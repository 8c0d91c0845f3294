using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using LoopWatch.Agent.Broker;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// The bench over MQTT: flat out, first the bare subscriber then the real agent host take the same generated stream
/// in turn; at a fixed rate, the agent alone, timed from publish to the end of its ingest path.
/// </summary>
internal static class MqttBench
{
    /// <summary>Runs the phases and returns the agent's figures.</summary>
    public static async Task<BenchResult> RunAsync(BenchOptions o, IReadOnlyList<LoopOptions> loops, ProcessGauge gauge, TextWriter progress, CancellationToken ct)
    {
        EmbeddedBroker? broker = null;
        // The broker's warnings (a dropped message, a lost client) name the client on the console, as the agent's do.
        using var brokerLogs = LoggerFactory.Create(b => b.AddSimpleConsole(c => c.SingleLine = true).SetMinimumLevel(LogLevel.Warning));
        var host = o.BrokerHost ?? "127.0.0.1";
        var port = o.BrokerPort;
        if (o.BrokerHost is null)
        {
            port = FreeLoopbackPort();
            broker = new EmbeddedBroker(new BrokerOptions { Embedded = true, Port = port }, brokerLogs.CreateLogger<EmbeddedBroker>());
            await broker.StartAsync(ct);
        }
        try
        {
            var topics = loops.SelectMany(l => new[] { l.Pv!.Tag!, l.Sp!.Tag!, l.Op!.Tag! }).ToList();
            var duration = TimeSpan.FromSeconds(o.Seconds);
            var warmUp = TimeSpan.FromSeconds(Math.Min(10, o.Seconds / 5));
            double? baseline = null;
            if (o.Rate is null)
            {
                progress.WriteLine($"bench: bare subscriber, {o.Seconds:0.#} s flat out");
                await using var bare = new BareSubscriber(host, port, topics);
                await bare.StartAsync(ct);
                var g = new BenchGenerator(host, port, o.Loops);
                await g.RunAsync(null, duration, warmUp, () => bare.Tally.Count, _ => { }, ct);
                await DrainAsync(g, bare.Tally, ct);
                baseline = PerSecond(g, bare.Tally);
                if (bare.Tally.Count < g.Published)
                    progress.WriteLine($"bench: warning: the bare subscriber got {bare.Tally.Count:N0} of {g.Published:N0}; its rate is no fair baseline, repeat the run");
                ReportBroker(broker, progress);
            }

            progress.WriteLine($"bench: agent, {o.Seconds:0.#} s " + (o.Rate is { } r ? $"at {r:0} updates/s" : "flat out"));
            var dir = Directory.CreateTempSubdirectory("loopwatch-bench-").FullName;
            try
            {
                var heapBefore = GC.GetTotalMemory(forceFullCollection: true);
                var tally = new Tally();
                var options = new AgentOptions
                {
                    Broker = new BrokerOptions { Host = host, Port = port, ClientId = $"loopwatch-bench-agent-{Guid.NewGuid():N}" },
                    Dashboard = new DashboardOptions { Urls = "http://127.0.0.1:0" },
                    DataDir = dir,
                };
                options.Loops.AddRange(loops);
                var errors = new List<string>();
                var specs = AgentOptionsCheck.Check(options, errors);
                if (errors.Count > 0) throw new InvalidOperationException(string.Join("; ", errors));
                await using var app = AgentHost.Build(new AgentSetup(options, specs, null, TimeProvider.System),
                    l => l.SetMinimumLevel(LogLevel.Warning).AddFilter("Microsoft.AspNetCore.DataProtection", LogLevel.Error),
                    s => s.AddSingleton<IngestTap>((message, reason) =>
                    {
                        if (reason == RejectReason.None) tally.Take(message.CorrelationData);
                    }));
                await app.StartAsync(ct);
                var plant = app.Services.GetRequiredService<PlantState>();
                var wait = Stopwatch.StartNew();
                while (!plant.BrokerConnected)
                {
                    if (wait.Elapsed > TimeSpan.FromSeconds(120)) throw new TimeoutException("the agent did not subscribe within 120 s");
                    await Task.Delay(50, ct);
                }

                var gen = new BenchGenerator(host, port, o.Loops);
                using var reporting = new CancellationTokenSource();
                var report = ReportAsync(gen, tally, plant, progress, reporting.Token);
                gauge.Mark();
                var countAtMark = 0L;
                var allocatedAtMark = 0L;
                await gen.RunAsync(o.Rate, duration, warmUp, () => tally.Count, seq =>
                {
                    Volatile.Write(ref tally.TimeFrom, seq);
                    countAtMark = tally.Count;
                    allocatedAtMark = GC.GetTotalAllocatedBytes(precise: true);
                    gauge.Mark();
                }, ct);
                var cores = gauge.Cores();
                var cpuPerUpdate = gauge.CpuSeconds() * 1e6 / Math.Max(1, tally.Count - countAtMark);
                var allocatedPerUpdate = (GC.GetTotalAllocatedBytes(precise: true) - allocatedAtMark) / (double)Math.Max(1, tally.Count - countAtMark);
                await DrainAsync(gen, tally, ct);
                await reporting.CancelAsync();
                await report;
                var processed = PerSecond(gen, tally);
                // The agent does more than the bare subscriber with the same client library; well ahead of it, the baseline run was disturbed.
                if (baseline is > 0 && processed > 1.2 * baseline)
                    progress.WriteLine($"bench: warning: the agent ran {processed / baseline:0.0} times the bare subscriber's rate; the baseline run was disturbed (other load?), repeat the run");
                var counters = plant.Counters();
                progress.WriteLine($"bench: agent ingest counters: received {counters.Received}, accepted {counters.Accepted}, rejected {counters.Rejected}, unknown topic {counters.UnknownTopic}, late {counters.Late}, reconnects {counters.Reconnects}");
                ReportBroker(broker, progress);
                var heapAfter = GC.GetTotalMemory(forceFullCollection: true);
                var rss = gauge.PeakRssMb;
                await app.StopAsync(CancellationToken.None);
                await EndSessionAsync(host, port, options.Broker.ClientId, ct);
                return new BenchResult(o.Rate is null ? "MQTT, flat out" : "MQTT, fixed rate", o.Loops, gen.Published, tally.Count, gen.OfferedPerSecond, processed,
                    baseline, baseline is > 0 ? processed / baseline : null, gen.Published - tally.Count, tally.Duplicates,
                    tally.Latency.Percentile(0.99), tally.Latency.Percentile(0.5), cores, rss, (heapAfter - heapBefore) / (double)o.Loops, cpuPerUpdate, allocatedPerUpdate);
            }
            finally
            {
                Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
                try { Directory.Delete(dir, recursive: true); } catch (IOException) { /* a file still open: leave the temp folder */ }
            }
        }
        finally
        {
            if (broker is not null)
            {
                await broker.StopAsync(CancellationToken.None);
                await broker.DisposeAsync();
            }
        }
    }

    // Where a lost message went: the embedded broker's own counts (an external broker's are in its log).
    private static void ReportBroker(EmbeddedBroker? broker, TextWriter progress)
    {
        if (broker is not null) progress.WriteLine($"bench: embedded broker since start: dropped {broker.Dropped} (queue full), clients lost {broker.ClientsLost}");
    }

    // The agent keeps a persistent session (an hour) with a subscription per tag; left behind on an external broker by
    // every run, they made the broker match each message against them all and later runs slower. A clean start ends it.
    private static async Task EndSessionAsync(string host, int port, string clientId, CancellationToken ct)
    {
        using var client = new MQTTnet.MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MQTTnet.MqttClientOptionsBuilder().WithTcpServer(host, port).WithClientId(clientId)
            .WithProtocolVersion(MQTTnet.Formatter.MqttProtocolVersion.V500).WithCleanStart().WithSessionExpiryInterval(0).Build(), ct);
        await client.DisconnectAsync(new MQTTnet.MqttClientDisconnectOptionsBuilder().Build(), ct);
    }

    // Until everything published has arrived, or nothing more has come for 30 s (the rest is lost); a loaded machine stalls for seconds.
    private static async Task DrainAsync(BenchGenerator gen, Tally tally, CancellationToken ct)
    {
        var last = -1L;
        var idle = Stopwatch.StartNew();
        while (tally.Count < gen.Published && idle.Elapsed < TimeSpan.FromSeconds(30))
        {
            var now = tally.Count;
            if (now != last) { last = now; idle.Restart(); }
            await Task.Delay(20, ct);
        }
    }

    // A line every 10 s on stderr, so a long run shows whether the agent keeps up.
    private static async Task ReportAsync(BenchGenerator gen, Tally tally, PlantState plant, TextWriter progress, CancellationToken ct)
    {
        var clock = Stopwatch.StartNew();
        var pause = GC.GetTotalPauseDuration();
        int gen0 = GC.CollectionCount(0), gen1 = GC.CollectionCount(1), gen2 = GC.CollectionCount(2);
        while (!ct.IsCancellationRequested)
        {
            await Task.Delay(10_000, ct).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
            // The window's longest latency beside the collector's pauses tells a GC pause from other stalls.
            var p = GC.GetTotalPauseDuration();
            int g0 = GC.CollectionCount(0), g1 = GC.CollectionCount(1), g2 = GC.CollectionCount(2);
            progress.WriteLine($"bench: {clock.Elapsed.TotalSeconds,6:0} s  published {gen.Published,12:N0}  processed {tally.Count,12:N0}  behind {gen.Published - tally.Count,10:N0}  agent received {plant.Counters().Received,12:N0}"
                + $"  max latency {tally.TakeWindowMaxMs(),7:0} ms  GC pause {(p - pause).TotalMilliseconds,5:0} ms, gen0 {g0 - gen0}, gen1 {g1 - gen1}, gen2 {g2 - gen2}");
            (pause, gen0, gen1, gen2) = (p, g0, g1, g2);
        }
    }

    private static double PerSecond(BenchGenerator gen, Tally tally)
    {
        var seconds = Stopwatch.GetElapsedTime(gen.FirstTicks, tally.LastTicks).TotalSeconds;
        return seconds > 0 ? tally.Count / seconds : 0;
    }

    private static int FreeLoopbackPort()
    {
        using var l = new TcpListener(IPAddress.Loopback, 0);
        l.Start();
        return ((IPEndPoint)l.LocalEndpoint).Port;
    }
}

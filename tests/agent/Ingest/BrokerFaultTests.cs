using System.Collections.Concurrent;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Testing;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Tests.Ingest;

/// <summary>A real Mosquitto killed (SIGKILL) in mid-stream and brought back on the same port with its persistence.</summary>
public sealed class BrokerFaultTests
{
    private const string Id = "FIC-950";
    private const int SecondsPerPhase = 20;
    private const int TagsPerSecond = 4;

    [Fact]
    public async Task After_a_broker_kill_the_agent_backs_off_marks_the_gap_stale_reconnects_and_loses_no_qos1_message_published_while_it_was_away()
    {
        // The publisher has a listener of its own, so it can reach the broker while the agent's port stays closed.
        var publisherPort = FreePort.Next();
        var publisherListener = $"listener {publisherPort} 127.0.0.1";
        await using var broker = await Mosquitto.StartAsync(extraConfig: publisherListener);
        var logs = new FakeLoggerProvider();
        var loop = TestLoops.Pid(Id);
        loop.Limits = new LimitOptions { StaleSeconds = 5 };
        loop.Alarms = new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 };
        // Every message the agent's ingest took, by topic and payload: each published one is distinct (tag and timestamp).
        var taken = new ConcurrentQueue<string>();
        await using var agent = await RunningAgent.StartAsync([loop], embedded: false, brokerPort: broker.Port, logging: b => b.AddProvider(logs),
            services: s => s.AddSingleton<IngestTap>((message, reason) => taken.Enqueue($"{reason} {message.Topic} {Encoding.UTF8.GetString(message.Payload)}")));
        Task UntilTaken(long count, string what, TimeSpan? timeout = null) =>
            Eventually.Until(() => Task.FromResult(taken.Distinct().Count()), n => n >= count, timeout ?? TimeSpan.FromSeconds(30), what);
        await agent.UntilSubscribedAsync();
        var subscribed = DateTime.UtcNow;

        // Event time a little behind the wall clock, one value per tag and second.
        var start = DateTimeOffset.UtcNow.AddSeconds(-3 * SecondsPerPhase - 30);
        var published = await PublishAsync(publisherPort, start, 0);
        await UntilTaken(published, "the first phase taken");

        // Mid-stream the broker dies: the agent notices, and with no data its loop goes stale. Mosquitto keeps sessions
        // across a SIGKILL only as far as its last save (once a second here), so the kill waits for one after the subscription.
        await broker.WaitSavedAsync(subscribed);
        broker.Kill();
        await Eventually.Until(async () => Ingest(await agent.HealthAsync()).GetProperty("broker_connected").GetBoolean(), c => !c, what: "disconnect noticed");
        await Eventually.Until(() => agent.LoopAsync(Id), l => Findings(l!.Value).Contains("stale"), TimeSpan.FromSeconds(20), "gap marked stale");

        // The broker comes back with its persistence but, for now, only on the publisher's port: the agent is still away
        // while the next phase is published with QoS 1 and queued in its persistent session.
        await broker.RestartAsync(publisherListener, listen: false, readyPort: publisherPort);
        published += await PublishAsync(publisherPort, start, SecondsPerPhase);
        await broker.StopAsync(); // SIGTERM: the queue is written to the persistence file
        await broker.RestartAsync(publisherListener);

        // The agent gets back in by its own retries and receives every queued message, then the live stream goes on.
        await UntilTaken(published, "every message queued while the agent was away", TimeSpan.FromSeconds(60));
        published += await PublishAsync(publisherPort, start, 2 * SecondsPerPhase);
        await UntilTaken(published, "the live phase after the reconnect");
        var all = taken.ToArray();
        var ingest = Ingest(await agent.HealthAsync());
        // Nothing lost: every message published arrived, and none was refused.
        Assert.Equal(published, all.Distinct().Count());
        Assert.All(all, m => Assert.StartsWith("None ", m));
        Assert.Equal(0, ingest.GetProperty("rejected").GetInt64());
        Assert.Equal(all.Length, ingest.GetProperty("accepted").GetInt64());
        // QoS 1 is at least once (MQTT 5.0, 4.3.2): a message in flight when the broker was killed is sent again from its
        // last save, so only first-phase messages may come twice; held and sampled in event time, they change nothing.
        var firstPhaseEnd = start.AddSeconds(SecondsPerPhase);
        foreach (var twice in all.GroupBy(m => m).Where(g => g.Count() > 1))
            Assert.True(DateTimeOffset.Parse(twice.Key[(twice.Key.IndexOf("\"timestamp\": \"", StringComparison.Ordinal) + 14)..^2], System.Globalization.CultureInfo.InvariantCulture) < firstPhaseEnd,
                $"taken twice outside the first phase: {twice.Key}");
        Assert.True(ingest.GetProperty("reconnects").GetInt64() >= 1);
        var samples = (await agent.LoopAsync(Id))!.Value.GetProperty("samples").GetInt64();
        Assert.Equal(3 * SecondsPerPhase, samples);

        // Backoff: the retry delays logged while the broker was away double from 1 s (capped at 30 s).
        var delays = logs.Collector.GetSnapshot().Where(r => r.Id.Id == 1003)
            .Select(r => double.Parse(r.StructuredState!.Single(kv => kv.Key == "DelaySeconds").Value!, System.Globalization.CultureInfo.InvariantCulture)).ToList();
        Assert.True(delays.Count >= 2, $"{delays.Count} retries logged");
        Assert.Equal(1, delays[0]);
        for (var i = 1; i < delays.Count; i++) Assert.Equal(Math.Min(30, delays[i - 1] * 2), delays[i]);

        // No false alarm on resume: the only alarm the loop ever had is the stale one for the gap, and the healthy
        // loop carries no finding after the replay.
        var alarms = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all&since=2000-01-01T00:00:00Z");
        var transitions = alarms.GetProperty("transitions").EnumerateArray().Where(t => t.GetProperty("loop_id").GetString() == Id).ToList();
        var annunciated = transitions.Where(t => t.GetProperty("to").GetString() == "unacknowledged").Select(t => t.GetProperty("kind").GetString()).Distinct().ToList();
        Assert.True(annunciated.SequenceEqual(["stale"]), string.Join("; ", transitions.Select(t => $"{t.GetProperty("kind")} {t.GetProperty("from")}->{t.GetProperty("to")}")));
    }

    private static JsonElement Ingest(JsonElement health) => health.GetProperty("ingest");

    private static string Findings(JsonElement loop) => loop.GetProperty("findings").GetRawText();

    /// <summary>Publishes one phase (PV at SP, steady output, auto) with QoS 1, each message acknowledged by the broker.</summary>
    private static async Task<long> PublishAsync(int port, DateTimeOffset start, int firstSecond)
    {
        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId($"quillmoor-gateway-{firstSecond}").Build());
        long count = 0;
        for (var s = firstSecond; s < firstSecond + SecondsPerPhase; s++)
        {
            var ts = start.AddSeconds(s).ToString("O");
            foreach (var (tag, value) in new[] { ("pv", "100"), ("sp", "100"), ("op", "40"), ("mode", "\"auto\"") })
            {
                var result = await client.PublishStringAsync($"test/{Id}/{tag}", $$"""{"value": {{value}}, "timestamp": "{{ts}}"}""", MqttQualityOfServiceLevel.AtLeastOnce);
                Assert.True(result.IsSuccess, result.ReasonString);
                count++;
            }
        }
        await client.DisconnectAsync();
        Assert.Equal(SecondsPerPhase * TagsPerSecond, count);
        return count;
    }
}

using System.Net.Http.Json;
using System.Text.Json;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Agent.Storage;
using LoopWatch.Storage.Reading;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Tests.Reload;

/// <summary>Loops added, removed and changed in the configuration file of a running agent, fed through a real Mosquitto.</summary>
public sealed class ConfigurationReloadTests
{
    // Long stale time: the kept loop must not go stale (which restarts its windows) while the test edits the file.
    private static LoopOptions Kept(string id)
    {
        var o = TestLoops.Pid(id);
        o.Limits = new LimitOptions { StaleSeconds = 3600 };
        return o;
    }

    private sealed class Rig : IAsyncDisposable
    {
        public required Mosquitto Broker { get; init; }
        public required RunningAgent Agent { get; init; }
        public required IMqttClient Publisher { get; init; }
        public required string ConfigPath { get; init; }
        public required LogCapture Logs { get; init; }

        public static async Task<Rig> StartAsync(params LoopOptions[] loops)
        {
            var broker = await Mosquitto.StartAsync();
            var dir = Directory.CreateTempSubdirectory("lw-reload-").FullName;
            var config = Path.Combine(dir, "conf", "loopwatch.json");
            Directory.CreateDirectory(Path.GetDirectoryName(config)!);
            await File.WriteAllTextAsync(config, ConfigFile.Text(broker.Port, "http://127.0.0.1:0", loops));
            var logs = new LogCapture();
            var agent = await RunningAgent.StartFromFileAsync(config, Path.Combine(dir, "data"), logs);
            var publisher = new MqttClientFactory().CreateMqttClient();
            await publisher.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", broker.Port).WithClientId($"pub-{Guid.NewGuid():N}").Build());
            await Eventually.Until(async () => (await agent.HealthAsync()).GetProperty("ingest").GetProperty("broker_connected").GetBoolean(), c => c, what: "agent subscribed");
            return new Rig { Broker = broker, Agent = agent, Publisher = publisher, ConfigPath = config, Logs = logs };
        }

        public Task RewriteAsync(params LoopOptions[] loops) => ConfigFile.WriteAsync(ConfigPath, ConfigFile.Text(Broker.Port, "http://127.0.0.1:0", loops));

        public Task PublishAsync(string topic, string payload) => Publisher.PublishAsync(new MqttApplicationMessageBuilder()
            .WithTopic(topic).WithPayload(payload).WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce).Build());

        /// <summary>Seconds <paramref name="from"/>..<paramref name="to"/> of a steady loop at SP with a moving output, stamped from <paramref name="t0"/>.</summary>
        public async Task FeedAsync(string id, DateTimeOffset t0, int from, int to)
        {
            for (var s = from; s <= to; s++)
            {
                var ts = t0.AddSeconds(s).ToString("O");
                await PublishAsync($"test/{id}/pv", $$"""{"value": {{100 + s % 3}}, "timestamp": "{{ts}}"}""");
                await PublishAsync($"test/{id}/sp", $$"""{"value": 100, "timestamp": "{{ts}}"}""");
                await PublishAsync($"test/{id}/op", $$"""{"value": {{40 + 5 * (s % 4)}}, "timestamp": "{{ts}}"}""");
            }
        }

        public async Task<long> SamplesAsync(string id) => (await Agent.LoopAsync(id))?.GetProperty("samples").GetInt64() ?? -1;

        public async Task<string[]> IdsAsync() => (await Agent.LoopsAsync()).EnumerateArray().Select(l => l.GetProperty("id").GetString()!).Order().ToArray();

        public async ValueTask DisposeAsync()
        {
            Publisher.Dispose();
            await Agent.DisposeAsync();
            await Broker.DisposeAsync();
        }
    }

    [Fact]
    public async Task An_added_loop_appears_and_receives_data_while_the_unchanged_loop_keeps_its_samples_and_statistics()
    {
        await using var rig = await Rig.StartAsync(Kept("FIC-990"));
        var t0 = DateTimeOffset.UtcNow;
        await rig.FeedAsync("FIC-990", t0, 0, 20);
        // Sample-and-hold closes a 1 s interval when the next one starts, and the last one once the plant clock passes it.
        var samples = await Eventually.Until(() => rig.SamplesAsync("FIC-990"), n => n >= 21, what: "21 samples of FIC-990");
        var stats = (await rig.Agent.LoopAsync("FIC-990"))!.Value.GetProperty("stats").GetRawText();

        await rig.RewriteAsync(Kept("FIC-990"), Kept("FIC-991"));
        await Eventually.Until(() => rig.IdsAsync(), ids => ids.Contains("FIC-991"), what: "FIC-991 in /api/loops");
        Assert.Equal(["FIC-990", "FIC-991"], await rig.IdsAsync());
        // The kept loop is the same cell: same sample count and statistics, not a fresh start.
        var kept = (await rig.Agent.LoopAsync("FIC-990"))!.Value;
        Assert.Equal(samples, kept.GetProperty("samples").GetInt64());
        Assert.Equal(stats, kept.GetProperty("stats").GetRawText());

        // The subscription followed the file: the new loop's tags arrive, and the kept loop's still do.
        await rig.FeedAsync("FIC-991", t0, 21, 25);
        await rig.FeedAsync("FIC-990", t0, 21, 25);
        await Eventually.Until(() => rig.SamplesAsync("FIC-991"), n => n >= 4, what: "FIC-991 sampled");
        await Eventually.Until(() => rig.SamplesAsync("FIC-990"), n => n > samples, what: "FIC-990 still fed");
        Assert.Contains(rig.Logs.Lines, l => l.EventId == 4710 && l.Message.Contains("1 loops added"));

        // A changed loop (a different limit) starts afresh: new windows, no samples yet.
        var changed = Kept("FIC-990");
        changed.Limits!.OffsetPct = 4;
        await rig.RewriteAsync(changed, Kept("FIC-991"));
        await Eventually.Until(() => rig.SamplesAsync("FIC-990"), n => n == 0, what: "FIC-990 restarted by its change");
        Assert.True(await rig.SamplesAsync("FIC-991") >= 4); // untouched by its neighbour's change
    }

    [Fact]
    public async Task A_removed_loop_disappears_is_unsubscribed_and_its_active_alarm_is_journaled_back_to_normal()
    {
        await using var rig = await Rig.StartAsync(Kept("FIC-992"), TestLoops.FastStale("FIC-993"));
        var t0 = DateTimeOffset.UtcNow;
        await rig.FeedAsync("FIC-993", t0, 0, 2);
        await Eventually.Until(async () => await rig.Agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=active"),
            j => j.GetProperty("alarms").EnumerateArray().Any(a => a.GetProperty("id").GetString() == "FIC-993:stale"), what: "stale alarm on FIC-993");

        await rig.RewriteAsync(Kept("FIC-992"));
        await Eventually.Until(() => rig.IdsAsync(), ids => !ids.Contains("FIC-993"), what: "FIC-993 gone from /api/loops");
        Assert.Equal(["FIC-992"], await rig.IdsAsync());
        var alarms = await rig.Agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all&since=2000-01-01T00:00:00Z");
        Assert.DoesNotContain(alarms.GetProperty("alarms").EnumerateArray(), a => a.GetProperty("loop_id").GetString() == "FIC-993");
        var retired = alarms.GetProperty("transitions").EnumerateArray()
            .Where(t => t.GetProperty("id").GetString() == "FIC-993:stale").Select(t => t.GetProperty("to").GetString()).ToList();
        Assert.Equal(["unacknowledged", "out-of-service", "normal"], retired); // raised, then retired through out of service
        // Journaled in SQLite with the reason, and the stored state is normal, so a restart does not bring the alarm back.
        var storage = rig.Agent.App.Services.GetRequiredService<AgentStorage>();
        await storage.Writer.FlushAsync();
        var journal = await storage.Reader.ReadJournalAsync(new JournalQuery(0, long.MaxValue, LoopId: "FIC-993", Kind: "stale", OldestFirst: true));
        var stored = journal.Where(j => j.LoopId == "FIC-993" && j.Kind == "stale").ToList();
        Assert.Equal(["unacknowledged", "out-of-service", "normal"], stored.Select(j => j.ToState));
        Assert.All(stored.Skip(1), j => Assert.Equal("loop removed from the configuration", j.Comment));
        Assert.All(await storage.Reader.ReadAlarmStatesAsync(), a => { if (a.LoopId == "FIC-993") Assert.Equal("normal", a.State); });

        // Unsubscribed: a value on the removed loop's tag never arrives; one on the kept loop, published after it, does.
        var before = (await rig.Agent.HealthAsync()).GetProperty("ingest");
        await rig.PublishAsync("test/FIC-993/pv", "50");
        await rig.PublishAsync("test/FIC-992/pv", "60");
        var after = await Eventually.Until(async () => (await rig.Agent.HealthAsync()).GetProperty("ingest"),
            i => i.GetProperty("accepted").GetInt64() > before.GetProperty("accepted").GetInt64(), what: "the kept loop's value");
        Assert.Equal(before.GetProperty("received").GetInt64() + 1, after.GetProperty("received").GetInt64());
        Assert.Equal(before.GetProperty("unknown_topic").GetInt64(), after.GetProperty("unknown_topic").GetInt64());
    }

    [Fact]
    public async Task An_invalid_file_is_refused_with_the_key_logged_and_the_running_loops_stay()
    {
        await using var rig = await Rig.StartAsync(Kept("FIC-994"));
        var bad = Kept("FIC-995");
        bad.Kind = "cascade-ish";
        await rig.RewriteAsync(Kept("FIC-994"), bad);
        var refusal = await Eventually.Until(() => Task.FromResult(rig.Logs.Lines), lines => lines.Any(l => l.EventId == 4711), what: "refusal logged");
        var line = refusal.First(l => l.EventId == 4711);
        Assert.Equal(LogLevel.Error, line.Level);
        Assert.Contains("Loops:1 (FIC-995): Kind", line.Message);

        // Not JSON at all: refused the same way.
        await ConfigFile.WriteAsync(rig.ConfigPath, "{ \"LoopWatch\": { \"Loops\": [ ");
        await Eventually.Until(() => Task.FromResult(rig.Logs.Lines), lines => lines.Count(l => l.EventId == 4711) >= 2, what: "second refusal logged");
        Assert.Contains(rig.Logs.Lines, l => l.EventId == 4711 && l.Message.Contains("not valid JSON"));

        Assert.Equal(["FIC-994"], await rig.IdsAsync());
        await rig.FeedAsync("FIC-994", DateTimeOffset.UtcNow, 0, 3);
        await Eventually.Until(() => rig.SamplesAsync("FIC-994"), n => n >= 3, what: "FIC-994 still fed");
        Assert.DoesNotContain(rig.Logs.Lines, l => l.EventId == 4710);
    }
}

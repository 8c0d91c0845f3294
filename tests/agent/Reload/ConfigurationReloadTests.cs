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
            await agent.UntilSubscribedAsync();
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

    private static LoopOptions Sparkplug(string id, string node, string? device)
    {
        var prefix = device is null ? $"spBv1.0/Quillmoor/{node}:{id}/" : $"spBv1.0/Quillmoor/{node}/{device}:{id}/";
        var o = Kept(id);
        o.Pv = new SignalOptions { Tag = prefix + "PV", Min = 0, Max = 200 };
        o.Sp = new SignalOptions { Tag = prefix + "SP" };
        o.Op = new SignalOptions { Tag = prefix + "OP" };
        return o;
    }

    private static double Pv(JsonElement? loop) =>
        loop is { } l && l.GetProperty("pv").ValueKind == JsonValueKind.Number ? l.GetProperty("pv").GetDouble() : double.NaN;

    [Fact]
    public async Task Sparkplug_loops_changed_added_on_a_born_node_or_on_a_new_edge_node_are_fed_without_a_restart()
    {
        var fic501 = Sparkplug("FIC-501", "Intake", "Skid1");
        await using var rig = await Rig.StartAsync(fic501);
        // Event time near the wall clock, like a live edge node.
        await using var intake = await SparkplugEdge.ConnectAsync(rig.Broker.Port, "Quillmoor", "Intake");
        intake.Time = DateTimeOffset.UtcNow;
        await intake.NodeBirthAsync();
        // The device's birth names a metric no loop uses yet (FIC-502): its alias is known from here on.
        await intake.DeviceBirthAsync("Skid1", SparkplugEdge.Double("FIC-501/PV", 100, 11), SparkplugEdge.Double("FIC-501/SP", 110, 12),
            SparkplugEdge.Double("FIC-501/OP", 50, 13), SparkplugEdge.Double("FIC-502/PV", 20, 21), SparkplugEdge.Double("FIC-502/SP", 22, 22),
            SparkplugEdge.Double("FIC-502/OP", 30, 23));
        await Eventually.Until(() => rig.Agent.LoopAsync("FIC-501"), l => Pv(l) == 100, what: "FIC-501 from its birth");

        // FIC-501 changed (a fresh cell), FIC-502 added on the born device, PIC-601 on an edge node not followed so far.
        var changed = Sparkplug("FIC-501", "Intake", "Skid1");
        changed.Description = "Raw water to clarifier 1";
        await rig.RewriteAsync(changed, Sparkplug("FIC-502", "Intake", "Skid1"), Sparkplug("PIC-601", "Outfall", null));
        await Eventually.Until(() => rig.IdsAsync(), ids => ids.Contains("PIC-601"), what: "reload applied");
        Assert.True(double.IsNaN(Pv(await rig.Agent.LoopAsync("FIC-501")))); // the changed loop starts afresh

        // Data by alias only (Sparkplug 3.0, 6.4.5 "Metric", from memory): the session from before the reload still holds.
        intake.Time = intake.Time.AddSeconds(1);
        await intake.DeviceDataAsync("Skid1", SparkplugEdge.Alias(11, 104.5), SparkplugEdge.Alias(21, 24.5));
        await Eventually.Until(() => rig.Agent.LoopAsync("FIC-501"), l => Pv(l) == 104.5, what: "the changed FIC-501 fed by alias");
        await Eventually.Until(() => rig.Agent.LoopAsync("FIC-502"), l => Pv(l) == 24.5, what: "the added FIC-502 fed by alias");

        // The new edge node is subscribed on the live session: its birth reaches PIC-601.
        await using var outfall = await SparkplugEdge.ConnectAsync(rig.Broker.Port, "Quillmoor", "Outfall");
        outfall.Time = DateTimeOffset.UtcNow;
        await outfall.NodeBirthAsync(SparkplugEdge.Double("PIC-601/PV", 3.5, 1), SparkplugEdge.Double("PIC-601/SP", 3.6, 2), SparkplugEdge.Double("PIC-601/OP", 41, 3));
        await Eventually.Until(() => rig.Agent.LoopAsync("PIC-601"), l => Pv(l) == 3.5, what: "PIC-601 from the new edge node's birth");

        // Every Intake loop removed: the agent stops following that node.
        await rig.RewriteAsync(Sparkplug("PIC-601", "Outfall", null));
        await Eventually.Until(() => rig.IdsAsync(), ids => ids.SequenceEqual(["PIC-601"]), what: "Intake loops removed");
        var nodes = (await rig.Agent.Http.GetFromJsonAsync<JsonElement>("/api/sparkplug")).GetProperty("nodes").EnumerateArray()
            .Select(n => n.GetProperty("edge_node").GetString()!).ToArray();
        Assert.Equal(["Outfall"], nodes);
    }
}

using System.Buffers;
using System.Collections.Concurrent;
using System.Net.Http.Json;
using System.Text.Json;
using Google.Protobuf;
using LoopWatch.Agent.Sparkplug;
using LoopWatch.Agent.Sparkplug.Wire;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Sparkplug;

/// <summary>
/// Sparkplug B through a real Mosquitto broker, with payloads encoded by Google.Protobuf. Section numbers are those of
/// the Eclipse Sparkplug 3.0 specification, from memory.
/// </summary>
public sealed class SparkplugIngestTests
{
    private const string Group = "Quillmoor";
    private const string Node = "Intake";

    // FIC-501 lives on device Skid1, PIC-502 on the edge node itself. Stale after an hour: a death must not wait for it.
    private static LoopOptions[] Loops() =>
    [
        Loop("FIC-501", $"spBv1.0/{Group}/{Node}/Skid1:FIC-501/"),
        Loop("PIC-502", $"spBv1.0/{Group}/{Node}:PIC-502/"),
    ];

    private static LoopOptions Loop(string id, string prefix) => new()
    {
        Id = id, Kind = "pid", Process = "flow", Area = "Intake",
        Pv = new SignalOptions { Tag = prefix + "PV", Min = 0, Max = 200 },
        Sp = new SignalOptions { Tag = prefix + "SP" },
        Op = new SignalOptions { Tag = prefix + "OP" },
        Limits = new LimitOptions { StaleSeconds = 3600 },
    };

    private static async Task<JsonElement> CountersAsync(RunningAgent agent) =>
        (await agent.Http.GetFromJsonAsync<JsonElement>("/api/sparkplug")).GetProperty("counters");

    private static Task<JsonElement> CountersUntil(RunningAgent agent, string key, long atLeast) =>
        Eventually.Until(() => CountersAsync(agent), c => c.GetProperty(key).GetInt64() >= atLeast, what: $"{key} >= {atLeast}");

    private static Task<JsonElement?> LoopUntil(RunningAgent agent, string id, Func<JsonElement, bool> done, string what) =>
        Eventually.Until(() => agent.LoopAsync(id), l => l is { } x && done(x), what: what);

    private static double Number(JsonElement loop, string key) =>
        loop.GetProperty(key).ValueKind == JsonValueKind.Number ? loop.GetProperty(key).GetDouble() : double.NaN;

    private static JsonElement? Stale(JsonElement loop) =>
        loop.GetProperty("findings").EnumerateArray().Where(f => f.GetProperty("kind").GetString() == "stale").Cast<JsonElement?>().FirstOrDefault();

    private static async Task BirthAsync(SparkplugEdge edge)
    {
        await edge.NodeBirthAsync(SparkplugEdge.Double("PIC-502/PV", 5, 1), SparkplugEdge.Double("PIC-502/SP", 6, 2), SparkplugEdge.Double("PIC-502/OP", 40, 3));
        await edge.DeviceBirthAsync("Skid1", SparkplugEdge.Double("FIC-501/PV", 100, 11), SparkplugEdge.Double("FIC-501/SP", 110, 12), SparkplugEdge.Double("FIC-501/OP", 50, 13));
    }

    [Fact]
    public async Task Birth_then_data_by_alias_reaches_the_loops_through_the_same_loop_state()
    {
        await using var rig = await Rig.StartAsync();
        var (broker, agent) = (rig.Broker, rig.Agent);
        await using var edge = await SparkplugEdge.ConnectAsync(broker.Port, Group, Node);

        await BirthAsync(edge);
        var born = await LoopUntil(agent, "FIC-501", l => Number(l, "op") == 50, "birth values of FIC-501");
        Assert.Equal(100, Number(born!.Value, "pv")); // 6.4.19 DBIRTH: the birth carries every metric's current value

        edge.Time = edge.Time.AddSeconds(2);
        // 6.4.5 "Metric": after a birth, data may name a metric by its alias only, without name or type.
        await edge.DeviceDataAsync("Skid1", SparkplugEdge.Alias(11, 104.5), SparkplugEdge.Alias(13, 52.25));
        await edge.NodeDataAsync(SparkplugEdge.Alias(1, 5.5));

        var fic = await LoopUntil(agent, "FIC-501", l => Number(l, "pv") == 104.5 && Number(l, "op") == 52.25, "FIC-501 data by alias");
        Assert.Equal(110, Number(fic!.Value, "sp"));
        Assert.Equal(new DateTimeOffset(2026, 3, 2, 0, 0, 2, TimeSpan.Zero), fic.Value.GetProperty("last_update").GetDateTimeOffset()); // 5.1: payload timestamp is event time
        await LoopUntil(agent, "PIC-502", l => Number(l, "pv") == 5.5 && Number(l, "op") == 40, "PIC-502 node metric by alias");

        var counters = await CountersAsync(agent);
        Assert.Equal(2, counters.GetProperty("births").GetInt64());
        Assert.Equal(0, counters.GetProperty("sequence_gaps").GetInt64());
        Assert.Equal(0, counters.GetProperty("unknown_aliases").GetInt64());
        // The same accepted counter as plain topics: 6 birth values and 3 data values went through PlantState.Take.
        Assert.Equal(9, (await agent.HealthAsync()).GetProperty("ingest").GetProperty("accepted").GetInt64());
    }

    [Fact]
    public async Task Data_by_name_is_taken_with_the_type_it_carries()
    {
        await using var rig = await Rig.StartAsync();
        var (broker, agent) = (rig.Broker, rig.Agent);
        await using var edge = await SparkplugEdge.ConnectAsync(broker.Port, Group, Node);

        await edge.NodeBirthAsync(SparkplugEdge.Double("PIC-502/PV", 5), SparkplugEdge.Double("PIC-502/SP", 6), SparkplugEdge.Double("PIC-502/OP", 40));
        edge.Time = edge.Time.AddSeconds(1);
        // 6.4.16 "Datatypes": Int32 travels in the uint32 field as two's complement, Float in float_value.
        await edge.NodeDataAsync(
            new Payload.Types.Metric { Name = "PIC-502/PV", Datatype = (uint)DataType.Int32, IntValue = unchecked((uint)-3) },
            new Payload.Types.Metric { Name = "PIC-502/OP", Datatype = (uint)DataType.Float, FloatValue = 61.5f });

        var pic = await LoopUntil(agent, "PIC-502", l => Number(l, "op") == 61.5, "PIC-502 data by name");
        Assert.Equal(-3, Number(pic!.Value, "pv"));
        Assert.Equal(0, (await CountersAsync(agent)).GetProperty("unknown_aliases").GetInt64());
    }

    [Fact]
    public async Task A_death_makes_the_loops_of_that_device_or_node_stale_at_once_and_a_rebirth_ends_it()
    {
        await using var rig = await Rig.StartAsync();
        var (broker, agent) = (rig.Broker, rig.Agent);
        var edge = await SparkplugEdge.ConnectAsync(broker.Port, Group, Node, bdSeq: 7);
        await BirthAsync(edge);
        await LoopUntil(agent, "PIC-502", l => Number(l, "op") == 40, "birth values");

        // 6.4.25 "DDEATH": the device's metrics are stale from the death's timestamp, not after StaleSeconds (3600 s here).
        edge.Time = edge.Time.AddSeconds(5);
        await edge.DeviceDeathAsync("Skid1");
        var fic = await LoopUntil(agent, "FIC-501", l => Stale(l) is not null, "FIC-501 stale after DDEATH");
        var stale = Stale(fic!.Value)!.Value;
        Assert.Equal(edge.Time, stale.GetProperty("start").GetDateTimeOffset());
        Assert.Equal($"{Group}/{Node}/Skid1", stale.GetProperty("source").GetString());
        Assert.Null(Stale((await agent.LoopAsync("PIC-502"))!.Value)); // the node's own loop is still alive

        // 6.4.24 "NDEATH": the broker publishes the will when the edge node drops; every loop on the node is stale.
        await edge.DieAsync();
        await edge.DisposeAsync();
        var pic = await LoopUntil(agent, "PIC-502", l => Stale(l) is not null, "PIC-502 stale after NDEATH");
        Assert.Equal($"{Group}/{Node}", Stale(pic!.Value)!.Value.GetProperty("source").GetString());
        Assert.Equal(2, (await CountersAsync(agent)).GetProperty("deaths").GetInt64());

        // 5.4: a new session (NBIRTH with the next bdSeq, then DBIRTH) brings current values and ends the stale state.
        await using var reborn = await SparkplugEdge.ConnectAsync(broker.Port, Group, Node, bdSeq: 8);
        reborn.Time = edge.Time.AddSeconds(10);
        await BirthAsync(reborn);
        await LoopUntil(agent, "FIC-501", l => Stale(l) is null, "FIC-501 fresh after rebirth");
        await LoopUntil(agent, "PIC-502", l => Stale(l) is null, "PIC-502 fresh after rebirth");
    }

    [Fact]
    public async Task Sequence_gaps_and_unknown_aliases_are_counted_and_with_the_option_off_nothing_is_published()
    {
        await using var rig = await Rig.StartAsync(rebirth: false);
        var (broker, agent, commands) = (rig.Broker, rig.Agent, rig.Commands);
        await using var edge = await SparkplugEdge.ConnectAsync(broker.Port, Group, Node);
        await BirthAsync(edge);

        // 6.4.4 "Payload" seq: 0-255 and wrapping; 300 messages in order pass 255 -> 0 without a gap.
        for (var i = 0; i < 300; i++) await edge.NodeDataAsync(SparkplugEdge.Alias(1, i));
        await LoopUntil(agent, "PIC-502", l => Number(l, "pv") == 299, "300 data messages");
        Assert.Equal(0, (await CountersAsync(agent)).GetProperty("sequence_gaps").GetInt64());

        edge.Skip(3);
        await edge.NodeDataAsync(SparkplugEdge.Alias(1, 12.5));
        var counters = await CountersUntil(agent, "sequence_gaps", 1);
        await LoopUntil(agent, "PIC-502", l => Number(l, "pv") == 12.5, "value after the gap"); // a gap is counted, the value still taken

        await edge.NodeDataAsync(SparkplugEdge.Alias(99, 1));
        counters = await CountersUntil(agent, "unknown_aliases", 1);
        Assert.Equal(1, counters.GetProperty("sequence_gaps").GetInt64());
        Assert.Equal(2, counters.GetProperty("rebirths_needed").GetInt64());
        Assert.Equal(0, counters.GetProperty("rebirth_requests_sent").GetInt64());

        // Read-only by default: no publishing client exists for rebirths, and no command reached the broker.
        Assert.DoesNotContain(agent.App.Services.GetServices<IHostedService>(), s => s is SparkplugRebirth);
        await commands.SentinelAsync();
        Assert.DoesNotContain(commands.Received, m => m.Topic != CommandWatcher.SentinelTopic);
    }

    [Fact]
    public async Task With_the_option_on_an_unknown_alias_sends_one_rate_limited_rebirth_command()
    {
        await using var rig = await Rig.StartAsync(rebirth: true);
        var (broker, agent, commands) = (rig.Broker, rig.Agent, rig.Commands);
        await using var edge = await SparkplugEdge.ConnectAsync(broker.Port, Group, Node);
        await BirthAsync(edge);

        await edge.DeviceDataAsync("Skid1", SparkplugEdge.Alias(42, 1));
        var ncmd = await Eventually.Until(() => Task.FromResult(commands.Received.ToArray()), r => r.Length > 0, what: "NCMD from the agent");
        Assert.Equal($"spBv1.0/{Group}/NCMD/{Node}", ncmd[0].Topic); // 4.1.3: commands to the node go on NCMD, even for a device's alias
        var metric = Assert.Single(ncmd[0].Payload.Metrics);
        Assert.Equal("Node Control/Rebirth", metric.Name); // 6.4.22 "NCMD": the rebirth request metric
        Assert.Equal((uint)DataType.Boolean, metric.Datatype);
        Assert.True(metric.BooleanValue);

        // Rate-limited: a second reason within Sparkplug:RebirthMinSeconds (60) is counted, not sent.
        await edge.DeviceDataAsync("Skid1", SparkplugEdge.Alias(43, 1));
        var counters = await CountersUntil(agent, "rebirth_requests_held", 1);
        Assert.Equal(1, counters.GetProperty("rebirth_requests_sent").GetInt64());
        Assert.Equal(2, counters.GetProperty("unknown_aliases").GetInt64());
        await commands.SentinelAsync();
        Assert.Single(commands.Received, m => m.Topic != CommandWatcher.SentinelTopic);
    }

    /// <summary>Mosquitto, the agent subscribed to it and a watcher on every Sparkplug command topic.</summary>
    private sealed class Rig(Mosquitto broker, RunningAgent agent, CommandWatcher commands) : IAsyncDisposable
    {
        public Mosquitto Broker { get; } = broker;
        public RunningAgent Agent { get; } = agent;
        public CommandWatcher Commands { get; } = commands;

        public static async Task<Rig> StartAsync(bool rebirth = false)
        {
            var broker = await Mosquitto.StartAsync();
            var agent = await RunningAgent.StartAsync(Loops(), embedded: false, brokerPort: broker.Port, tweak: o => o.Sparkplug.RequestRebirth = rebirth);
            await agent.UntilSubscribedAsync();
            return new Rig(broker, agent, await CommandWatcher.StartAsync(broker.Port));
        }

        public async ValueTask DisposeAsync()
        {
            await Commands.DisposeAsync();
            await Agent.DisposeAsync();
            await Broker.DisposeAsync();
        }
    }

    /// <summary>A subscriber on every Sparkplug command topic; a sentinel it publishes itself marks "everything before has arrived".</summary>
    private sealed class CommandWatcher : IAsyncDisposable
    {
        public const string SentinelTopic = "spBv1.0/Sentinel/NCMD/watcher";
        private readonly IMqttClient _client;

        private CommandWatcher(IMqttClient client) => _client = client;

        public ConcurrentQueue<(string Topic, Payload Payload)> Received { get; } = new();

        public static async Task<CommandWatcher> StartAsync(int port)
        {
            var client = new MqttClientFactory().CreateMqttClient();
            var watcher = new CommandWatcher(client);
            client.ApplicationMessageReceivedAsync += e =>
            {
                watcher.Received.Enqueue((e.ApplicationMessage.Topic, Payload.Parser.ParseFrom(e.ApplicationMessage.Payload.ToArray())));
                return Task.CompletedTask;
            };
            await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId($"ncmd-watch-{Guid.NewGuid():N}").Build());
            await client.SubscribeAsync(new MqttClientSubscribeOptionsBuilder().WithTopicFilter("spBv1.0/+/NCMD/#").WithTopicFilter("spBv1.0/+/DCMD/#").Build());
            return watcher;
        }

        public async Task SentinelAsync()
        {
            await _client.PublishAsync(new MqttApplicationMessageBuilder().WithTopic(SentinelTopic).WithPayload(new Payload().ToByteArray()).Build());
            await Eventually.Until(() => Task.FromResult(Received.Any(m => m.Topic == SentinelTopic)), s => s, what: "sentinel back");
        }

        public async ValueTask DisposeAsync()
        {
            await _client.DisconnectAsync();
            _client.Dispose();
        }
    }
}

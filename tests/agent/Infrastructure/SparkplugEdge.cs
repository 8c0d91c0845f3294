using Google.Protobuf;
using LoopWatch.Agent.Sparkplug.Wire;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// A Sparkplug B edge node for tests: an MQTTnet client that publishes payloads encoded by Google.Protobuf with the
/// session rules of Sparkplug 3.0 (NDEATH as the will with bdSeq, seq 0-255 running over every message after NBIRTH).
/// </summary>
public sealed class SparkplugEdge : IAsyncDisposable
{
    private readonly IMqttClient _client;
    private ulong _seq;

    private SparkplugEdge(IMqttClient client, string group, string node, ulong bdSeq)
    {
        _client = client;
        Group = group;
        Node = node;
        BdSeq = bdSeq;
    }

    public string Group { get; }
    public string Node { get; }
    public ulong BdSeq { get; }

    /// <summary>Event time of the next payload; tests move it on.</summary>
    public DateTimeOffset Time { get; set; } = new(2026, 3, 2, 0, 0, 0, TimeSpan.Zero);

    /// <summary>Connects with the NDEATH will, as 5.4 "Edge Node Session Establishment" asks.</summary>
    public static async Task<SparkplugEdge> ConnectAsync(int port, string group, string node, ulong bdSeq = 0)
    {
        var client = new MqttClientFactory().CreateMqttClient();
        var death = new Payload { Metrics = { new Payload.Types.Metric { Name = "bdSeq", Datatype = (uint)DataType.Int64, LongValue = bdSeq } } };
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId($"edge-{node}-{Guid.NewGuid():N}")
            .WithProtocolVersion(MQTTnet.Formatter.MqttProtocolVersion.V500)
            .WithWillTopic($"spBv1.0/{group}/NDEATH/{node}").WithWillPayload(death.ToByteArray()).WithWillQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce)
            .Build());
        return new SparkplugEdge(client, group, node, bdSeq);
    }

    public static Payload.Types.Metric Double(string name, double value, ulong? alias = null)
    {
        var m = new Payload.Types.Metric { Name = name, Datatype = (uint)DataType.Double, DoubleValue = value };
        if (alias is { } a) m.Alias = a;
        return m;
    }

    public static Payload.Types.Metric Alias(ulong alias, double value) => new() { Alias = alias, DoubleValue = value };

    /// <summary>NBIRTH: seq starts again at 0 and bdSeq is added (6.4.18).</summary>
    public Task NodeBirthAsync(params Payload.Types.Metric[] metrics)
    {
        _seq = 0;
        var all = new[] { new Payload.Types.Metric { Name = "bdSeq", Datatype = (uint)DataType.Int64, LongValue = BdSeq } }.Concat(metrics);
        return SendAsync($"spBv1.0/{Group}/NBIRTH/{Node}", all, advance: false);
    }

    public Task DeviceBirthAsync(string device, params Payload.Types.Metric[] metrics) => SendAsync($"spBv1.0/{Group}/DBIRTH/{Node}/{device}", metrics);

    public Task NodeDataAsync(params Payload.Types.Metric[] metrics) => SendAsync($"spBv1.0/{Group}/NDATA/{Node}", metrics);

    public Task DeviceDataAsync(string device, params Payload.Types.Metric[] metrics) => SendAsync($"spBv1.0/{Group}/DDATA/{Node}/{device}", metrics);

    public Task DeviceDeathAsync(string device) => SendAsync($"spBv1.0/{Group}/DDEATH/{Node}/{device}", []);

    /// <summary>Loses <paramref name="messages"/> sequence numbers, as if messages went missing on the way.</summary>
    public void Skip(int messages) => _seq += (ulong)messages;

    /// <summary>Drops the connection so the broker publishes the NDEATH will (MQTT 5 reason 0x04).</summary>
    public Task DieAsync() => _client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().WithReason(MqttClientDisconnectOptionsReason.DisconnectWithWillMessage).Build());

    private async Task SendAsync(string topic, IEnumerable<Payload.Types.Metric> metrics, bool advance = true)
    {
        if (advance) _seq = (_seq + 1) % 256;
        var payload = new Payload { Timestamp = (ulong)Time.ToUnixTimeMilliseconds(), Seq = _seq, Metrics = { metrics } };
        await _client.PublishAsync(new MqttApplicationMessageBuilder().WithTopic(topic).WithPayload(payload.ToByteArray())
            .WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce).Build());
    }

    public async ValueTask DisposeAsync()
    {
        if (_client.IsConnected) await _client.DisconnectAsync();
        _client.Dispose();
    }
}

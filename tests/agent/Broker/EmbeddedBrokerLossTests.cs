using System.Net.Sockets;
using LoopWatch.Agent.Tests.Infrastructure;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Testing;
using MQTTnet;
using MQTTnet.Formatter;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Tests.Broker;

/// <summary>
/// The embedded broker counts the QoS 0 messages MQTTnet drops when a subscriber's queue is full, and the clients it
/// loses without a DISCONNECT, in the log and on <c>/metrics</c>: losses that would otherwise go unseen.
/// </summary>
public sealed class EmbeddedBrokerLossTests
{
    private const int Limit = 10;
    private const int Burst = 200;

    [Fact]
    public async Task Messages_dropped_for_a_full_queue_are_counted_logged_and_exposed()
    {
        var logs = new FakeLoggerProvider();
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-990")], embedded: true, brokerPort: port,
            tweak: o => o.Broker.MaxPendingMessagesPerClient = Limit, logging: b => b.AddProvider(logs));

        // A subscriber that stops reading (a hung gateway): once the socket buffers are full, the broker queues for it.
        var subscriberId = $"quillmoor-lab-{Guid.NewGuid():N}";
        using var subscriber = new TcpClient { ReceiveBufferSize = 4096 };
        await subscriber.ConnectAsync("127.0.0.1", port);
        var stream = subscriber.GetStream();
        await MqttWire.ConnectAsync(stream, subscriberId);
        // OASIS MQTT 3.1.1 section 3.8: SUBSCRIBE, packet id 1, one filter at QoS 0; SUBACK is 5 bytes.
        var filter = "quillmoor-lab/#"u8.ToArray();
        await stream.WriteAsync((byte[])[0x82, (byte)(2 + 2 + filter.Length + 1), 0, 1, 0, (byte)filter.Length, .. filter, 0]);
        Assert.Equal(0x90, (await MqttWire.ReadPacketAsync(stream)).Type);

        // 200 messages of 64 KB (12.8 MB) at QoS 0: more than loopback socket buffers hold.
        using (var publisher = await ConnectAsync(port, $"quillmoor-lab-pub-{Guid.NewGuid():N}"))
        {
            var payload = new byte[64 * 1024];
            for (var i = 0; i < Burst; i++)
                await publisher.PublishAsync(new MqttApplicationMessageBuilder().WithTopic("quillmoor-lab/ti-1").WithPayload(payload).Build());
            await publisher.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build());
        }

        // MQTTnet drops past the limit without a word (a fact of the library, measured here); the agent counts each drop.
        var m = await Eventually.Until(() => Metrics.MetricsTests.ScrapeAsync(agent), s => s.Get("loopwatch_broker_messages_dropped_total") > 0, what: "drops counted");
        // The subscriber reads again: every message published is either delivered or counted as dropped.
        long received = 0;
        _ = Task.Run(async () =>
        {
            try
            {
                while (true) if ((await MqttWire.ReadPacketAsync(stream)).Type >> 4 == 3) Interlocked.Increment(ref received);
            }
            catch (Exception e) when (e is IOException or EndOfStreamException or ObjectDisposedException) { /* the test closed the socket */ }
        });
        var total = await Eventually.Until(async () => Interlocked.Read(ref received) + (long)(await Metrics.MetricsTests.ScrapeAsync(agent)).Get("loopwatch_broker_messages_dropped_total"),
            t => t >= Burst, what: "every message delivered or counted as dropped");
        Assert.Equal(Burst, total);
        // The first drop is logged at once, naming the subscriber and the key to raise; the rest (fewer than 10,000) are not.
        var line = Assert.Single(logs.Collector.GetSnapshot(), r => r.Id.Id == 2002);
        Assert.Contains(subscriberId, line.Message);
        Assert.Contains("Broker:MaxPendingMessagesPerClient", line.Message);
    }

    [Fact]
    public async Task A_client_gone_without_disconnect_is_counted_and_logged()
    {
        var logs = new FakeLoggerProvider();
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-991")], embedded: true, brokerPort: port, logging: b => b.AddProvider(logs));
        var before = await Metrics.MetricsTests.ScrapeAsync(agent);
        Assert.Equal(0, before.Get("loopwatch_broker_clients_lost_total"));

        // A clean DISCONNECT is no loss.
        using (var clean = await ConnectAsync(port, $"quillmoor-lab-clean-{Guid.NewGuid():N}"))
            await clean.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build());
        // A gateway whose connection just ends (MQTT 3.1.1 CONNECT by hand, then the socket closed, no DISCONNECT).
        var id = $"quillmoor-lab-gone-{Guid.NewGuid():N}";
        using (var tcp = new TcpClient())
        {
            await tcp.ConnectAsync("127.0.0.1", port);
            await MqttWire.ConnectAsync(tcp.GetStream(), id);
        }

        var m = await Eventually.Until(() => Metrics.MetricsTests.ScrapeAsync(agent), s => s.Get("loopwatch_broker_clients_lost_total") >= 1, what: "lost client counted");
        Assert.Equal(1, m.Get("loopwatch_broker_clients_lost_total"));
        var line = Assert.Single(logs.Collector.GetSnapshot(), r => r.Id.Id == 2003);
        Assert.Contains(id, line.Message);
    }

    private static async Task<IMqttClient> ConnectAsync(int port, string clientId)
    {
        var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId(clientId).WithProtocolVersion(MqttProtocolVersion.V500).Build());
        return client;
    }
}

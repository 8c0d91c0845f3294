using System.Net;
using System.Net.Sockets;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Ingest;

/// <summary>The agent's broker connection as seen from outside: its CONNECT packet on the wire and its TCP options.</summary>
public sealed class ConnectionTests
{
    [Theory]
    [InlineData(null, 60)] // the default
    [InlineData(45, 45)]
    public async Task The_connect_packet_carries_Broker_KeepAliveSeconds(int? configured, int expected)
    {
        // A listener standing in for the broker: it reads the first packet and never answers.
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        var port = ((IPEndPoint)listener.LocalEndpoint).Port;
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-995")], embedded: false, brokerPort: port,
            tweak: o => { if (configured is { } k) o.Broker.KeepAliveSeconds = k; });
        using var timeout = new CancellationTokenSource(TimeSpan.FromSeconds(60));
        using var connection = await listener.AcceptTcpClientAsync(timeout.Token);
        var stream = connection.GetStream();
        var packet = await MqttWire.ReadPacketAsync(stream, timeout.Token);

        // OASIS MQTT 5.0 section 3.1.2: CONNECT (type 1), protocol name "MQTT", level 5, connect flags, then the
        // keep-alive as a two-byte big-endian number of seconds.
        Assert.Equal(0x10, packet.Type);
        Assert.Equal([0, 4, (byte)'M', (byte)'Q', (byte)'T', (byte)'T', 5], packet.Body[..7]);
        Assert.Equal(expected, (packet.Body[8] << 8) | packet.Body[9]);
    }

    [Fact]
    public async Task The_subscription_socket_offers_tcp_window_scaling()
    {
        // With an 8 KB socket buffer (MQTTnet's default) the kernel offers no window scaling, and a backlog at the
        // broker then crawled at a few hundred messages a second (measured with bench). RFC 7323 section 2: the
        // scale is fixed in the SYN, so ss shows it on the established connection as wscale:<sent to peer>,<own>.
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        var port = ((IPEndPoint)listener.LocalEndpoint).Port;
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-996")], embedded: false, brokerPort: port);
        using var timeout = new CancellationTokenSource(TimeSpan.FromSeconds(60));
        using var connection = await listener.AcceptTcpClientAsync(timeout.Token);
        var agentPort = ((IPEndPoint)connection.Client.RemoteEndPoint!).Port;

        var (exit, ss, error) = await ToolRun.RunAsync("ss", "-tin", "state", "established", $"( sport = :{agentPort} )");
        Assert.True(exit == 0, error);
        var scale = System.Text.RegularExpressions.Regex.Match(ss, @"wscale:(\d+),(\d+)");
        Assert.True(scale.Success, ss);
        Assert.True(int.Parse(scale.Groups[2].Value) > 0, $"the agent's socket offers no window scaling:\n{ss}");
    }
}

using LoopWatch.Agent.Configuration;
using MQTTnet;

namespace LoopWatch.Agent.Broker;

/// <summary>Client options for every connection of the agent to the configured broker: the subscription and the side connections (health, rebirth requests).</summary>
public static class BrokerClient
{
    /// <summary>
    /// Socket send and receive buffer of the agent's broker connections. MQTTnet sets 8 KB unless told otherwise, which
    /// also turns off TCP window scaling: with a backlog at the broker, the subscription then fell to a few hundred
    /// messages a second with retransmissions, even on loopback, until the broker dropped it (measured with <c>bench</c>).
    /// The kernel caps it at its own maximum (<c>net.core.rmem_max</c> on Linux).
    /// </summary>
    public const int SocketBufferBytes = 1 << 20;

    /// <summary>Asks for <see cref="SocketBufferBytes"/> on the connection; every MQTT client the agent makes uses it.</summary>
    public static MqttClientOptionsBuilder WithSocketBuffers(this MqttClientOptionsBuilder builder) => builder.WithTcpServer(t => t.BufferSize = SocketBufferBytes);

    /// <summary>Address, client id, keep-alive, credentials and TLS as configured; the callbacks hear which broker certificate was refused and why, or accepted.</summary>
    public static MqttClientOptionsBuilder Builder(BrokerOptions broker, string clientId, Action<string>? refused = null, Action<string>? accepted = null)
    {
        var b = new MqttClientOptionsBuilder().WithTcpServer(broker.Host, broker.Port).WithSocketBuffers().WithClientId(clientId).WithKeepAlivePeriod(TimeSpan.FromSeconds(broker.KeepAliveSeconds));
        if (broker.Username is not null) b.WithCredentials(broker.Username, broker.Password);
        return b.WithBrokerTls(broker, refused, accepted);
    }

    /// <summary>A side connection: client id <c>&lt;ClientId&gt;-<paramref name="suffix"/></c>, otherwise as <see cref="Builder"/>.</summary>
    public static MqttClientOptions Options(BrokerOptions broker, string suffix) => Builder(broker, $"{broker.ClientId}-{suffix}").Build();
}

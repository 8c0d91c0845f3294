using LoopWatch.Agent.Configuration;
using MQTTnet;

namespace LoopWatch.Agent.Broker;

/// <summary>Client options for every connection of the agent to the configured broker: the subscription and the side connections (health, rebirth requests).</summary>
public static class BrokerClient
{
    /// <summary>Address, client id, credentials and TLS as configured; the callbacks hear which broker certificate was refused and why, or accepted.</summary>
    public static MqttClientOptionsBuilder Builder(BrokerOptions broker, string clientId, Action<string>? refused = null, Action<string>? accepted = null)
    {
        var b = new MqttClientOptionsBuilder().WithTcpServer(broker.Host, broker.Port).WithClientId(clientId);
        if (broker.Username is not null) b.WithCredentials(broker.Username, broker.Password);
        return b.WithBrokerTls(broker, refused, accepted);
    }

    /// <summary>A side connection: client id <c>&lt;ClientId&gt;-<paramref name="suffix"/></c>, otherwise as <see cref="Builder"/>.</summary>
    public static MqttClientOptions Options(BrokerOptions broker, string suffix) => Builder(broker, $"{broker.ClientId}-{suffix}").Build();
}

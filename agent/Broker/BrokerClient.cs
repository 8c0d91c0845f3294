using LoopWatch.Agent.Configuration;
using MQTTnet;

namespace LoopWatch.Agent.Broker;

/// <summary>Client options for the agent's side connections to the configured broker (health, rebirth requests).</summary>
public static class BrokerClient
{
    /// <summary>Address, client id <c>&lt;ClientId&gt;-<paramref name="suffix"/></c>, credentials and TLS as configured.</summary>
    public static MqttClientOptions Options(BrokerOptions broker, string suffix)
    {
        var b = new MqttClientOptionsBuilder().WithTcpServer(broker.Host, broker.Port).WithClientId($"{broker.ClientId}-{suffix}");
        if (broker.Username is not null) b.WithCredentials(broker.Username, broker.Password);
        if (broker.UseTls) b.WithTlsOptions(o => o.UseTls());
        return b.Build();
    }
}

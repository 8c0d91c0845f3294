using System.Net;
using LoopWatch.Agent.Configuration;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using MQTTnet.Server;

namespace LoopWatch.Agent.Broker;

/// <summary>An MQTT broker inside the agent (MQTTnet.Server), bound to loopback, for the demo and small installations.</summary>
public sealed class EmbeddedBroker(BrokerOptions options, ILogger<EmbeddedBroker> log) : IHostedService, IAsyncDisposable
{
    private MqttServer? _server;

    /// <summary>Starts listening; throws when the port is taken.</summary>
    public async Task StartAsync(CancellationToken cancellationToken)
    {
        var serverOptions = new MqttServerOptionsBuilder()
            .WithDefaultEndpoint()
            .WithDefaultEndpointBoundIPAddress(IPAddress.Loopback)
            .WithDefaultEndpointBoundIPV6Address(IPAddress.None)
            .WithDefaultEndpointPort(options.Port)
            // MQTTnet drops QoS 0 messages silently past this queue length; the default loses messages in bursts.
            .WithMaxPendingMessagesPerClient(options.MaxPendingMessagesPerClient)
            .Build();
        _server = new MqttServerFactory().CreateMqttServer(serverOptions);
        await _server.StartAsync();
        AgentLog.BrokerStarted(log, IPAddress.Loopback.ToString(), options.Port);
    }

    /// <summary>Stops the broker.</summary>
    public async Task StopAsync(CancellationToken cancellationToken)
    {
        if (_server is not null) await _server.StopAsync();
    }

    /// <inheritdoc />
    public ValueTask DisposeAsync()
    {
        _server?.Dispose();
        _server = null;
        return ValueTask.CompletedTask;
    }
}

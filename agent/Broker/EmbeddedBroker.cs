using System.Net;
using System.Security.Cryptography;
using System.Text;
using LoopWatch.Agent.Configuration;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using MQTTnet.Server;

namespace LoopWatch.Agent.Broker;

/// <summary>
/// An MQTT broker inside the agent (MQTTnet.Server) for the demo and small installations, bound to loopback unless
/// <c>Broker:ListenAddress</c> says otherwise; with <c>Broker:Username</c> set every client must give those credentials.
/// </summary>
public sealed class EmbeddedBroker(BrokerOptions options, ILogger<EmbeddedBroker> log) : IHostedService, IAsyncDisposable
{
    private MqttServer? _server;
    private long _dropped, _droppedLogged, _clientsLost;

    /// <summary>QoS 0 messages the broker dropped because a subscriber's queue was full (MQTTnet drops them silently).</summary>
    public long Dropped => Interlocked.Read(ref _dropped);

    /// <summary>Client connections that ended without a DISCONNECT (keep-alive timeout, reset, send timeout).</summary>
    public long ClientsLost => Interlocked.Read(ref _clientsLost);

    /// <summary>Starts listening; throws when the port is taken.</summary>
    public async Task StartAsync(CancellationToken cancellationToken)
    {
        var address = IPAddress.Parse(options.ListenAddress);
        var serverOptions = new MqttServerOptionsBuilder()
            .WithDefaultEndpoint()
            .WithDefaultEndpointBoundIPAddress(address)
            .WithDefaultEndpointBoundIPV6Address(IPAddress.None)
            .WithDefaultEndpointPort(options.Port)
            // MQTTnet drops QoS 0 messages silently past this queue length; the default loses messages in bursts.
            .WithMaxPendingMessagesPerClient(options.MaxPendingMessagesPerClient)
            .Build();
        _server = new MqttServerFactory().CreateMqttServer(serverOptions);
        // Past the limit MQTTnet drops the oldest queued message (its default overflow strategy, kept) and says so only
        // here; the enqueued-or-dropped event would cost an allocation per message and subscriber.
        _server.QueuedApplicationMessageOverwrittenAsync += e =>
        {
            CountDrop(e.ReceiverClientId);
            return Task.CompletedTask;
        };
        _server.ClientDisconnectedAsync += e =>
        {
            if (e.DisconnectType != MqttClientDisconnectType.Clean)
            {
                Interlocked.Increment(ref _clientsLost);
                AgentLog.BrokerClientLost(log, e.ClientId, e.DisconnectType.ToString(), e.ReasonCode?.ToString() ?? "none");
            }
            return Task.CompletedTask;
        };
        if (options.Username is { Length: > 0 } user) _server.ValidatingConnectionAsync += e => Validate(e, user, options.Password ?? "");
        await _server.StartAsync();
        AgentLog.BrokerStarted(log, address.ToString(), options.Port);
    }

    // The first drop is logged at once, then a line per further 10,000 at most, so a flood does not flood the log.
    private void CountDrop(string receiver)
    {
        var n = Interlocked.Increment(ref _dropped);
        var logged = Interlocked.Read(ref _droppedLogged);
        if ((logged == 0 || n - logged >= 10_000) && Interlocked.CompareExchange(ref _droppedLogged, n, logged) == logged)
            AgentLog.BrokerDropped(log, receiver, n, options.MaxPendingMessagesPerClient);
    }

    private static Task Validate(ValidatingConnectionEventArgs e, string user, string password)
    {
        // Fixed-time comparison, so the answer's timing tells nothing about how much of the password was right.
        var ok = CryptographicOperations.FixedTimeEquals(Encoding.UTF8.GetBytes(e.UserName ?? ""), Encoding.UTF8.GetBytes(user))
            & CryptographicOperations.FixedTimeEquals(Encoding.UTF8.GetBytes(e.Password ?? ""), Encoding.UTF8.GetBytes(password));
        if (!ok) e.ReasonCode = MQTTnet.Protocol.MqttConnectReasonCode.BadUserNameOrPassword;
        return Task.CompletedTask;
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

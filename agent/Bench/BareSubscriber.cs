using LoopWatch.Agent.Broker;
using MQTTnet;
using MQTTnet.Formatter;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Bench;

/// <summary>The baseline: an MQTTnet client subscribed to the same topics as the agent that only counts what arrives.</summary>
internal sealed class BareSubscriber(string host, int port, IReadOnlyList<string> topics) : IAsyncDisposable
{
    private readonly IMqttClient _client = new MqttClientFactory().CreateMqttClient();

    /// <summary>What arrived.</summary>
    public Tally Tally { get; } = new();

    /// <summary>Connects and subscribes, in the same packet sizes as the agent.</summary>
    public async Task StartAsync(CancellationToken ct)
    {
        _client.ApplicationMessageReceivedAsync += e =>
        {
            Tally.Take(e.ApplicationMessage.CorrelationData);
            return Task.CompletedTask;
        };
        await _client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer(host, port).WithSocketBuffers().WithClientId($"loopwatch-bench-bare-{Guid.NewGuid():N}")
            .WithKeepAlivePeriod(TimeSpan.FromSeconds(new Configuration.BrokerOptions().KeepAliveSeconds)) // as the agent's
            .WithProtocolVersion(MqttProtocolVersion.V500).WithCleanSession().Build(), ct);
        foreach (var chunk in topics.Chunk(500))
        {
            var subscribe = new MqttClientFactory().CreateSubscribeOptionsBuilder();
            foreach (var topic in chunk) subscribe.WithTopicFilter(f => f.WithTopic(topic).WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce));
            await _client.SubscribeAsync(subscribe.Build(), ct);
        }
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        try { if (_client.IsConnected) await _client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
        catch (Exception) { /* the broker may be gone already */ }
        _client.Dispose();
    }
}

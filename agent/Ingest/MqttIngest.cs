using System.Buffers;
using LoopWatch.Agent.Configuration;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// The agent's MQTT subscription: an ordinary client of whatever broker the configuration names, subscribed to every
/// loop tag, reconnecting with backoff. It only reads; it never publishes on a plant tag.
/// </summary>
public sealed class MqttIngest(BrokerOptions options, PlantState plant, TimeProvider time, ILogger<MqttIngest> log, IngestTap? tap = null) : BackgroundService
{
    private IMqttClient? _client;

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        var factory = new MqttClientFactory();
        using var client = factory.CreateMqttClient();
        _client = client;
        client.ApplicationMessageReceivedAsync += e =>
        {
            var payload = e.ApplicationMessage.Payload;
            var reason = payload.IsSingleSegment
                ? plant.Ingest(e.ApplicationMessage.Topic, payload.FirstSpan)
                : plant.Ingest(e.ApplicationMessage.Topic, payload.ToArray());
            tap?.Invoke(e.ApplicationMessage, reason);
            return Task.CompletedTask;
        };
        client.DisconnectedAsync += e =>
        {
            if (plant.BrokerConnected) AgentLog.Disconnected(log, e.Reason.ToString());
            plant.BrokerConnected = false;
            return Task.CompletedTask;
        };

        var delay = TimeSpan.FromSeconds(1);
        while (!stoppingToken.IsCancellationRequested)
        {
            if (!client.IsConnected)
            {
                try
                {
                    await ConnectAsync(factory, client, stoppingToken);
                    delay = TimeSpan.FromSeconds(1);
                }
                catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
                {
                    break;
                }
                catch (Exception e)
                {
                    AgentLog.BrokerUnreachable(log, options.Host, options.Port, e.Message, delay.TotalSeconds);
                    await Task.Delay(delay, time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
                    delay = TimeSpan.FromSeconds(Math.Min(30, delay.TotalSeconds * 2));
                    continue;
                }
            }
            await Task.Delay(TimeSpan.FromSeconds(1), time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
        }
        if (client.IsConnected)
        {
            try { await client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
            catch (Exception) { /* shutting down: the broker may already be gone */ }
        }
    }

    private async Task ConnectAsync(MqttClientFactory factory, IMqttClient client, CancellationToken ct)
    {
        var builder = new MqttClientOptionsBuilder()
            .WithTcpServer(options.Host, options.Port)
            .WithClientId(options.ClientId)
            .WithProtocolVersion(MQTTnet.Formatter.MqttProtocolVersion.V500)
            .WithCleanStart(false)
            .WithSessionExpiryInterval(3600)
            .WithKeepAlivePeriod(TimeSpan.FromSeconds(15));
        if (options.Username is not null) builder.WithCredentials(options.Username, options.Password);
        if (options.UseTls) builder.WithTlsOptions(o => o.UseTls());
        await client.ConnectAsync(builder.Build(), ct);

        // Several SUBSCRIBE packets of a few hundred filters each: brokers cap the packet size.
        foreach (var chunk in plant.Topics.Chunk(500))
        {
            var subscribe = factory.CreateSubscribeOptionsBuilder();
            foreach (var topic in chunk) subscribe.WithTopicFilter(f => f.WithTopic(topic).WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce));
            await client.SubscribeAsync(subscribe.Build(), ct);
        }
        Interlocked.Increment(ref plant.Connections);
        plant.BrokerConnected = true;
        AgentLog.Subscribed(log, options.Host, options.Port, plant.Topics.Count);
    }
}

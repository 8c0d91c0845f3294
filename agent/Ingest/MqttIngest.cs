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
public sealed class MqttIngest(BrokerOptions options, PlantState plant, Sparkplug.SparkplugReader sparkplug, TimeProvider time, ILogger<MqttIngest> log, IngestTap? tap = null) : BackgroundService
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
            var topic = e.ApplicationMessage.Topic;
            if (Sparkplug.SparkplugReader.Owns(topic))
            {
                sparkplug.Ingest(topic, payload.IsSingleSegment ? payload.FirstSpan : payload.ToArray());
                return Task.CompletedTask;
            }
            var reason = payload.IsSingleSegment ? plant.Ingest(topic, payload.FirstSpan) : plant.Ingest(topic, payload.ToArray());
            tap?.Invoke(e.ApplicationMessage, reason);
            return Task.CompletedTask;
        };
        // Loops added, changed or removed by a configuration reload: Sparkplug metrics go to their new routes, and the live
        // session follows the plain topics and edge nodes (a reconnect subscribes to plant.Topics and the filters anyway).
        Action<IReadOnlyList<string>, IReadOnlyList<string>> follow = (added, removed) =>
        {
            var nodes = sparkplug.Reroute(plant.Routes);
            _ = FollowAsync(factory, client, [.. added, .. nodes.Added], [.. removed, .. nodes.Dropped]);
        };
        plant.Reconfigured += follow;
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
                    AgentLog.BrokerUnreachable(log, options.Host, options.Port, Describe(e), delay.TotalSeconds);
                    await Task.Delay(delay, time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
                    delay = TimeSpan.FromSeconds(Math.Min(30, delay.TotalSeconds * 2));
                    continue;
                }
            }
            await Task.Delay(TimeSpan.FromSeconds(1), time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
        }
        plant.Reconfigured -= follow;
        if (client.IsConnected)
        {
            plant.BrokerConnected = false; // our own disconnect: no warning
            try { await client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
            catch (Exception) { /* shutting down: the broker may already be gone */ }
        }
    }

    private async Task ConnectAsync(MqttClientFactory factory, IMqttClient client, CancellationToken ct)
    {
        string? certificate = null;
        var builder = Broker.BrokerClient.Builder(options, options.ClientId, reason => AgentLog.CertificateRefused(log, options.Host, options.Port, reason), c => certificate = c)
            .WithProtocolVersion(MQTTnet.Formatter.MqttProtocolVersion.V500)
            .WithCleanStart(false)
            .WithSessionExpiryInterval(3600);
        await client.ConnectAsync(builder.Build(), ct);

        var topics = plant.Topics.Concat(sparkplug.Filters).ToList();
        await SubscribeAsync(factory, client, topics, ct);
        Interlocked.Increment(ref plant.Connections);
        plant.BrokerConnected = true;
        AgentLog.Subscribed(log, options.Host, options.Port, topics.Count);
        if (certificate is not null) AgentLog.TlsConnected(log, options.Host, options.Port, certificate);
    }

    /// <summary>The messages of an exception and its causes: a TLS failure says what went wrong only in the inner ones.</summary>
    private static string Describe(Exception e)
    {
        var messages = new List<string>();
        for (var x = e; x is not null; x = x.InnerException) if (!messages.Contains(x.Message)) messages.Add(x.Message);
        return string.Join(" <- ", messages);
    }

    private static async Task SubscribeAsync(MqttClientFactory factory, IMqttClient client, IEnumerable<string> topics, CancellationToken ct)
    {
        // Several SUBSCRIBE packets of a few hundred filters each: brokers cap the packet size.
        foreach (var chunk in topics.Chunk(500))
        {
            var subscribe = factory.CreateSubscribeOptionsBuilder();
            foreach (var topic in chunk) subscribe.WithTopicFilter(f => f.WithTopic(topic).WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce));
            await client.SubscribeAsync(subscribe.Build(), ct);
        }
    }

    private async Task FollowAsync(MqttClientFactory factory, IMqttClient client, IReadOnlyList<string> added, IReadOnlyList<string> removed)
    {
        if (!client.IsConnected) return;
        try
        {
            if (added.Count > 0) await SubscribeAsync(factory, client, added, CancellationToken.None);
            foreach (var chunk in removed.Chunk(500))
            {
                var unsubscribe = factory.CreateUnsubscribeOptionsBuilder();
                foreach (var topic in chunk) unsubscribe.WithTopicFilter(topic);
                await client.UnsubscribeAsync(unsubscribe.Build(), CancellationToken.None);
            }
        }
        catch (Exception e)
        {
            Service.ServiceLog.SubscriptionFailed(log, e.Message);
        }
    }
}

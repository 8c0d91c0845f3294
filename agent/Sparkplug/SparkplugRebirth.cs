using Google.Protobuf;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Sparkplug.Wire;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Sparkplug;

/// <summary>
/// Publishes the rebirth requests the reader queued, through a client of its own, so the ingest client stays read-only.
/// Registered only when <see cref="SparkplugOptions.RequestRebirth"/> is on; otherwise nothing in the agent can write to an edge node.
/// </summary>
public sealed class SparkplugRebirth(BrokerOptions broker, SparkplugReader reader, TimeProvider time, ILogger<SparkplugRebirth> log) : BackgroundService
{
    /// <summary>The metric that asks an edge node to publish its births again (Sparkplug 3.0, 6.4.22 "NCMD").</summary>
    public const string RebirthMetric = "Node Control/Rebirth";

    /// <summary>The NCMD payload of a rebirth request at wall time <paramref name="now"/>.</summary>
    public static byte[] Payload(DateTimeOffset now) => new Payload
    {
        Timestamp = (ulong)now.ToUnixTimeMilliseconds(),
        Metrics = { new Payload.Types.Metric { Name = RebirthMetric, Datatype = (uint)DataType.Boolean, BooleanValue = true } },
    }.ToByteArray();

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var client = new MqttClientFactory().CreateMqttClient();
        try
        {
            await foreach (var topic in reader.RebirthRequests.ReadAllAsync(stoppingToken))
            {
                try
                {
                    if (!client.IsConnected)
                    {
                        await client.ConnectAsync(Broker.BrokerClient.Options(broker, "rebirth"), stoppingToken);
                    }
                    // 4.2 "Sparkplug MQTT Topic & Messages": commands go at QoS 0 and are never retained.
                    await client.PublishAsync(new MqttApplicationMessageBuilder().WithTopic(topic).WithPayload(Payload(time.GetUtcNow()))
                        .WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtMostOnce).WithRetainFlag(false).Build(), stoppingToken);
                    reader.RebirthSent();
                    SparkplugLog.RebirthSent(log, topic);
                }
                catch (Exception e) when (e is not OperationCanceledException)
                {
                    SparkplugLog.RebirthFailed(log, topic, e.Message);
                }
            }
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested) { }
        if (client.IsConnected)
        {
            try { await client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
            catch (Exception) { /* shutting down: the broker may already be gone */ }
        }
    }
}

using System.Text.Json;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Dashboard.Api;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// Publishes each loop's health (state, active alarms, key statistics) as retained JSON on
/// <c>&lt;namespace&gt;/&lt;loop id&gt;/health</c> through its own MQTT client; the configuration check keeps the
/// namespace off every loop tag, so nothing is ever written to a control tag.
/// </summary>
public sealed class HealthPublisher(BrokerOptions broker, AlarmSystemOptions options, PlantState plant, AlarmEngine engine,
    TimeProvider time, ILogger<HealthPublisher> log) : BackgroundService
{
    /// <summary>The topic of one loop's health.</summary>
    public static string Topic(string ns, string loopId) => $"{ns.Trim('/')}/{loopId}/health";

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var client = new MqttClientFactory().CreateMqttClient();
        var interval = TimeSpan.FromSeconds(options.HealthIntervalSeconds);
        while (!stoppingToken.IsCancellationRequested)
        {
            try
            {
                if (!client.IsConnected)
                {
                    await client.ConnectAsync(Broker.BrokerClient.Options(broker, "health"), stoppingToken);
                }
                foreach (var cell in plant.Cells)
                {
                    var payload = JsonSerializer.Serialize(Health(cell), ApiJson.Options);
                    await client.PublishAsync(new MqttApplicationMessageBuilder().WithTopic(Topic(options.HealthNamespace, cell.Spec.Id))
                        .WithPayload(payload).WithRetainFlag().WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce).Build(), stoppingToken);
                }
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested) { break; }
            catch (Exception e)
            {
                AlarmLog.HealthPublishFailed(log, e.Message);
            }
            await Task.Delay(interval, time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
        }
        if (client.IsConnected)
        {
            try { await client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
            catch (Exception) { /* shutting down: the broker may already be gone */ }
        }
    }

    private object Health(LoopCell cell)
    {
        var (mode, stale, stats, last) = cell.Read(m => (m.Snapshot.Mode, m.IsStale, m.Statistics(), m.Snapshot.LastUpdateTicks));
        var alarms = new List<AlarmStatus>();
        engine.Loop(cell.Spec.Id)?.Collect(alarms);
        var active = alarms.Where(a => a.State is not (AlarmState.Normal or AlarmState.SuppressedByDesign)).ToList();
        var state = stale ? "stale"
            : mode == Analytics.Sampling.LoopMode.Manual ? "manual"
            : active.Any(a => a.ConditionActive) ? "alarm"
            : "ok";
        return new
        {
            loop = cell.Spec.Id,
            time = new DateTimeOffset(plant.Clock.NowTicks, TimeSpan.Zero),
            last_update = last == 0 ? (DateTimeOffset?)null : new DateTimeOffset(last, TimeSpan.Zero),
            state,
            alarms = active.Select(a => new { kind = a.Kind, state = AlarmNames.Of(a.State), priority = a.Priority.ToString().ToLowerInvariant() }),
            stats,
        };
    }
}

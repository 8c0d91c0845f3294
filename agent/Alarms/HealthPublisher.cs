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

    // Below Mosquitto's default of 20 QoS 1 messages in flight per client, so acknowledgements overlap without tripping its limit.
    private const int InFlight = 16;

    // Plants up to this size publish in one go; larger ones in one-second slices (see ExecuteAsync).
    private const int SliceFloor = 500;

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var client = new MqttClientFactory().CreateMqttClient();
        var interval = TimeSpan.FromSeconds(options.HealthIntervalSeconds);
        var pending = new List<Task>(InFlight);
        while (!stoppingToken.IsCancellationRequested)
        {
            var started = time.GetTimestamp();
            try
            {
                if (!client.IsConnected)
                {
                    await client.ConnectAsync(Broker.BrokerClient.Options(broker, "health"), stoppingToken);
                }
                // 10,000 loops in one burst took the CPU from ingest on a small machine and showed as a latency tail;
                // a large plant is spread over the interval in one-second slices instead.
                var cells = plant.Cells;
                var slices = Math.Max(1, (int)interval.TotalSeconds);
                var perSlice = Math.Max(SliceFloor, (cells.Count + slices - 1) / slices);
                for (var i = 0; i < cells.Count; i++)
                {
                    if (i > 0 && i % perSlice == 0)
                    {
                        var due = TimeSpan.FromSeconds(i / perSlice) - time.GetElapsedTime(started);
                        if (due > TimeSpan.Zero) await Task.Delay(due, time, stoppingToken);
                    }
                    var cell = cells[i];
                    var payload = JsonSerializer.Serialize(Health(cell), ApiJson.Options);
                    pending.Add(client.PublishAsync(new MqttApplicationMessageBuilder().WithTopic(Topic(options.HealthNamespace, cell.Spec.Id))
                        .WithPayload(payload).WithRetainFlag().WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce).Build(), stoppingToken));
                    if (pending.Count == InFlight) await Settle(pending);
                }
                await Settle(pending);
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested) { break; }
            catch (Exception e)
            {
                pending.Clear();
                AlarmLog.HealthPublishFailed(log, e.Message);
            }
            var rest = interval - time.GetElapsedTime(started);
            if (rest > TimeSpan.Zero) await Task.Delay(rest, time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
        }
        if (client.IsConnected)
        {
            try { await client.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
            catch (Exception) { /* shutting down: the broker may already be gone */ }
        }
    }

    private static async Task Settle(List<Task> pending)
    {
        try { await Task.WhenAll(pending); }
        finally { pending.Clear(); }
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

using System.Globalization;
using System.Text;
using LoopWatch.Agent.Broker;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Plant;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using MQTTnet;

namespace LoopWatch.Agent.Demo;

/// <summary>
/// Runs the demo plant and publishes every loop's PV, SP, OP (and mode, valve position) once per simulated second as
/// JSON with the simulated timestamp, as a plant gateway would. <c>--speed N</c> runs N simulated seconds per wall second.
/// </summary>
public sealed class PlantPublisher(DemoPlant plant, BrokerOptions broker, DemoRun run, TimeProvider time, ILogger<PlantPublisher> log) : BackgroundService
{
    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var client = new MqttClientFactory().CreateMqttClient();
        var options = new MqttClientOptionsBuilder().WithTcpServer(broker.Host, broker.Port).WithSocketBuffers().WithClientId("quillmoor-gateway")
            .WithCredentials(broker.Username, broker.Password).Build();
        AgentLog.DemoStarted(log, plant.Loops.Count, run.Speed);
        var simStart = run.Start;
        var wallStart = time.GetTimestamp();
        var payload = new StringBuilder(96);
        while (!stoppingToken.IsCancellationRequested)
        {
            if (!client.IsConnected)
            {
                try { await client.ConnectAsync(options, stoppingToken); }
                catch (Exception e) when (!stoppingToken.IsCancellationRequested)
                {
                    AgentLog.DemoPublishFailed(log, e.Message);
                    await Task.Delay(TimeSpan.FromSeconds(1), time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
                    continue;
                }
                catch (OperationCanceledException) { break; }
            }
            // Catch up with the wall clock: the simulation may run many seconds per wall second.
            var due = time.GetElapsedTime(wallStart).TotalSeconds * run.Speed;
            try
            {
                while (plant.Time < due && !stoppingToken.IsCancellationRequested)
                {
                    plant.Step();
                    var stamp = simStart.AddSeconds(plant.Time);
                    foreach (var loop in plant.Loops) await PublishLoop(client, loop, stamp, payload, stoppingToken);
                }
            }
            catch (OperationCanceledException) { break; }
            catch (Exception e) when (!stoppingToken.IsCancellationRequested)
            {
                AgentLog.DemoPublishFailed(log, e.Message);
            }
            await Task.Delay(TimeSpan.FromMilliseconds(Math.Clamp(1000 / run.Speed, 10, 1000)), time, stoppingToken)
                .ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
        }
    }

    private static async Task PublishLoop(IMqttClient client, SimulatedLoop loop, DateTimeOffset stamp, StringBuilder payload, CancellationToken ct)
    {
        var r = loop.Reading;
        var o = loop.Options;
        var ts = stamp.UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ss.fffZ", CultureInfo.InvariantCulture);
        await Publish(client, o.Pv!.Tag!, r.Pv, ts, payload, ct);
        if (o.Sp?.Tag is { } sp) await Publish(client, sp, r.Sp, ts, payload, ct);
        await Publish(client, o.Op!.Tag!, o.Kind == "on-off" ? (r.Op > 50 ? 1 : 0) : r.Op, ts, payload, ct);
        if (o.Mode?.Tag is { } mode)
        {
            var text = r.Mode == Analytics.Sampling.LoopMode.Manual ? "manual" : "auto";
            await client.PublishStringAsync(mode, $"{{\"value\":\"{text}\",\"timestamp\":\"{ts}\"}}", cancellationToken: ct);
        }
        if (o.Position?.Tag is { } zt) await Publish(client, zt, r.Position, ts, payload, ct);
    }

    private static Task Publish(IMqttClient client, string topic, double value, string ts, StringBuilder payload, CancellationToken ct)
    {
        payload.Clear().Append("{\"value\":").Append(Math.Round(value, 4).ToString("R", CultureInfo.InvariantCulture))
            .Append(",\"timestamp\":\"").Append(ts).Append("\"}");
        return client.PublishStringAsync(topic, payload.ToString(), cancellationToken: ct);
    }
}

using System.Text.Json;
using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Storage;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Writing;
using Microsoft.Extensions.Hosting;
using Prometheus;

namespace LoopWatch.Agent.Metrics;

/// <summary>
/// The agent's Prometheus metrics in a registry of its own (so two hosts in one process never share counters).
/// Counters and gauges are read from the live plant, alarm engine and storage writer when scraped; the write-latency
/// histogram is fed by the storage writer's <see cref="StorageWriter.BatchCommitted"/> event while the host runs.
/// </summary>
public sealed class AgentMetrics : IHostedService
{
    private static readonly RejectReason[] Reasons = Enum.GetValues<RejectReason>().Where(r => r != RejectReason.None).ToArray();
    private static readonly AlarmPriority[] Priorities = Enum.GetValues<AlarmPriority>();

    private readonly PlantState _plant;
    private readonly AlarmEngine _alarms;
    private readonly AgentStorage _storage;
    private readonly Broker.EmbeddedBroker? _broker;
    private readonly Counter _received, _accepted, _rejected, _unknown, _late, _rowsWritten, _rowsDropped;
    private readonly Counter? _brokerDropped, _brokerClientsLost;
    private readonly Gauge _connected, _loops, _loopsByState, _activeAlarms;
    private readonly Histogram _commitSeconds;
    private StorageWriter? _writer;

    /// <summary>Defines the metrics (the broker's only with the embedded broker); nothing is read until the first scrape.</summary>
    public AgentMetrics(PlantState plant, AlarmEngine alarms, AgentStorage storage, Broker.EmbeddedBroker? broker = null)
    {
        _broker = broker;
        _plant = plant;
        _alarms = alarms;
        _storage = storage;
        Registry = Prometheus.Metrics.NewCustomRegistry();
        var f = Prometheus.Metrics.WithCustomRegistry(Registry);
        _received = f.CreateCounter("loopwatch_messages_received_total", "MQTT messages received on subscribed topics.");
        _accepted = f.CreateCounter("loopwatch_messages_accepted_total", "Messages decoded and taken by a loop (late values included).");
        _rejected = f.CreateCounter("loopwatch_messages_rejected_total", "Messages whose payload could not be read, by reason.", "reason");
        _unknown = f.CreateCounter("loopwatch_messages_unknown_topic_total", "Messages on a topic no configured loop uses.");
        _late = f.CreateCounter("loopwatch_messages_late_total", "Values older than their loop's current sampling interval, dropped.");
        _connected = f.CreateGauge("loopwatch_broker_connected", "1 while the MQTT subscription is up, else 0.");
        _loops = f.CreateGauge("loopwatch_loops", "Loops configured.");
        _loopsByState = f.CreateGauge("loopwatch_loops_by_state", "Loops by state as the Plant page counts them (manual loops with findings count in both).", "state");
        _activeAlarms = f.CreateGauge("loopwatch_alarms_active", "Alarms not in normal (as /api/alarms?state=active lists them), by priority.", "priority");
        _commitSeconds = f.CreateHistogram("loopwatch_db_batch_commit_seconds", "Time to commit one batch of the storage writer.",
            new HistogramConfiguration { Buckets = Histogram.ExponentialBuckets(0.0005, 2, 14) }); // 0.5 ms .. about 4 s
        _rowsWritten = f.CreateCounter("loopwatch_db_rows_written_total", "Rows committed by the storage writer.");
        _rowsDropped = f.CreateCounter("loopwatch_db_rows_dropped_total", "Rows the storage writer dropped (queue full or lost at shutdown).");
        if (broker is not null)
        {
            _brokerDropped = f.CreateCounter("loopwatch_broker_messages_dropped_total", "Messages the embedded broker dropped because a subscriber's queue was full.");
            _brokerClientsLost = f.CreateCounter("loopwatch_broker_clients_lost_total", "Client connections of the embedded broker that ended without a DISCONNECT.");
        }
        // Labelled series exist from the start, so a rate() over them never starts from a missing series.
        foreach (var r in Reasons) _rejected.WithLabels(Label(r.ToString()));
        foreach (var p in Priorities) _activeAlarms.WithLabels(Label(p.ToString()));
        Registry.AddBeforeCollectCallback(Collect);
    }

    /// <summary>The registry <c>/metrics</c> serves.</summary>
    public CollectorRegistry Registry { get; }

    /// <inheritdoc />
    public Task StartAsync(CancellationToken cancellationToken)
    {
        _writer = _storage.Writer;
        _writer.BatchCommitted += Committed;
        return Task.CompletedTask;
    }

    /// <inheritdoc />
    public Task StopAsync(CancellationToken cancellationToken)
    {
        if (_writer is not null) _writer.BatchCommitted -= Committed;
        return Task.CompletedTask;
    }

    private void Committed(BatchCommit batch) => _commitSeconds.Observe(batch.Duration.TotalSeconds);

    private void Collect()
    {
        var c = _plant.Counters();
        _received.IncTo(c.Received);
        _accepted.IncTo(c.Accepted);
        foreach (var r in Reasons) _rejected.WithLabels(Label(r.ToString())).IncTo(_plant.RejectedFor(r));
        _unknown.IncTo(c.UnknownTopic);
        _late.IncTo(c.Late);
        _connected.Set(c.BrokerConnected ? 1 : 0);
        if (_broker is not null)
        {
            _brokerDropped!.IncTo(_broker.Dropped);
            _brokerClientsLost!.IncTo(_broker.ClientsLost);
        }

        var counts = LoopCounts.Of(_plant.Loops());
        _loops.Set(counts.Total);
        _loopsByState.WithLabels("healthy").Set(counts.Healthy);
        _loopsByState.WithLabels("with_findings").Set(counts.WithFindings);
        _loopsByState.WithLabels("manual").Set(counts.InManual);
        _loopsByState.WithLabels("stale").Set(counts.Stale);

        var active = _alarms.Alarms(activeOnly: true);
        foreach (var p in Priorities) _activeAlarms.WithLabels(Label(p.ToString())).Set(active.Count(a => a.Priority == p));

        if (_writer is { } w)
        {
            var wc = w.Counters;
            _rowsWritten.IncTo(wc.Written);
            _rowsDropped.IncTo(wc.Dropped);
        }
    }

    private static string Label(string name) => JsonNamingPolicy.SnakeCaseLower.ConvertName(name);
}

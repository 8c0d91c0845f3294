using LoopWatch.Agent.Configuration;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Dashboard.Model;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// All loops of the agent and the topic routing into them: decode, route, hold. Live ingest and offline analysis
/// both feed values through <see cref="Ingest"/> or <see cref="Take"/>.
/// </summary>
public sealed class PlantState : IPlantView
{
    // Replaced whole (never changed in place) by Reconfigure, so readers on other threads always see a consistent set.
    private LoopCell[] _cells;
    private Dictionary<string, LoopCell> _byId;
    private Dictionary<string, TagRoute> _routes;
    private readonly Action<FindingChange>? _findings;
    private readonly LoopHooks? _hooks;
    private readonly object _reconfigureGate = new();
    private long _lateOfRetired;
    private readonly TimeProvider _time;
    private readonly ILogger _log;
    private readonly bool _shared;
    private long _received, _accepted, _rejected, _unknown;
    private readonly long[] _rejectedBy = new long[Enum.GetValues<RejectReason>().Length];
    private long _nextRejectLogTicks;
    private long _suppressedRejectLogs;

    /// <summary>
    /// Builds the cells and routes; finding changes go to <paramref name="findings"/>, <paramref name="hooks"/> add per-loop
    /// detectors; <paramref name="shared"/> false when one thread feeds and reads everything (offline analysis), which skips the per-value locks.
    /// </summary>
    public PlantState(IReadOnlyList<LoopSpec> specs, PlantClock clock, TimeProvider time, ILogger<PlantState> log,
        Action<FindingChange>? findings = null, LoopHooks? hooks = null, bool shared = true)
    {
        Clock = clock;
        _time = time;
        _log = log;
        _findings = findings;
        _hooks = hooks;
        _shared = shared;
        _cells = specs.Select(s => new LoopCell(s, findings, hooks, shared)).ToArray();
        _byId = _cells.ToDictionary(c => c.Spec.Id, StringComparer.Ordinal);
        _routes = RoutesOf(_cells, null);
    }

    /// <summary>Raised after every <see cref="Reconfigure"/> with the plain topics to subscribe to and to drop (either list may be empty).</summary>
    public event Action<IReadOnlyList<string>, IReadOnlyList<string>>? Reconfigured;

    /// <summary>
    /// Takes a new set of loops while running (<paramref name="change"/> compares it with the running one): a kept loop
    /// keeps its cell (windows, statistics, tag counters); a new or changed loop gets a fresh cell; a removed loop is dropped.
    /// </summary>
    public void Reconfigure(IReadOnlyList<LoopSpec> specs, LoopSetChange change)
    {
        lock (_reconfigureGate)
        {
            var old = _byId;
            var cells = specs.Select(s => change.Kept.Contains(s.Id) ? old[s.Id] : new LoopCell(s, _findings, _hooks, _shared)).ToArray();
            var routes = RoutesOf(cells, _routes);
            foreach (var id in change.Removed.Concat(change.Changed)) Interlocked.Add(ref _lateOfRetired, old[id].Read(m => m.Snapshot.LateValues));
            var oldTopics = _routes.Keys;
            Volatile.Write(ref _routes, routes);
            Volatile.Write(ref _byId, cells.ToDictionary(c => c.Spec.Id, StringComparer.Ordinal));
            Volatile.Write(ref _cells, cells);
            // Plain topics only, as Topics gives them: Sparkplug tags are read through their edge node's subscription.
            var added = routes.Keys.Except(oldTopics).Where(t => !Sparkplug.SparkplugTag.IsSparkplug(t)).ToList();
            var dropped = oldTopics.Except(routes.Keys).Where(t => !Sparkplug.SparkplugTag.IsSparkplug(t)).ToList();
            // Raised even when no topic changed: a changed loop keeps its tags but gets new routes, which Sparkplug must take.
            Reconfigured?.Invoke(added, dropped);
        }
    }

    /// <summary>The plant's event clock.</summary>
    public PlantClock Clock { get; }

    /// <summary>Every plain topic the agent subscribes to (Sparkplug tags are covered by their edge node's subscription).</summary>
    public IReadOnlyCollection<string> Topics => _routes.Keys.Where(t => !Sparkplug.SparkplugTag.IsSparkplug(t)).ToList();

    /// <summary>The cell of a loop, or null.</summary>
    public LoopCell? Cell(string id) => _byId.GetValueOrDefault(id);

    /// <summary>The loop cells in configuration order.</summary>
    public IReadOnlyList<LoopCell> Cells => _cells;

    /// <summary>True once the MQTT subscription is up.</summary>
    public bool BrokerConnected { get; set; }

    /// <summary>Number of successful connections to the broker since start.</summary>
    public long Connections;

    /// <summary>The routes by tag, with their counters.</summary>
    public IReadOnlyDictionary<string, TagRoute> Routes => _routes;

    /// <summary>Takes one raw payload from a topic; returns why it was rejected, or <see cref="RejectReason.None"/>.</summary>
    public RejectReason Ingest(string topic, ReadOnlySpan<byte> payload)
    {
        Interlocked.Increment(ref _received);
        if (!_routes.TryGetValue(topic, out var route))
        {
            Interlocked.Increment(ref _unknown);
            return RejectReason.None;
        }
        var reason = PayloadDecoder.Decode(payload, route.ValueKind, out var value);
        if (reason == RejectReason.None && value.Ticks != 0 && Clock.TooFarAhead(value.Ticks)) reason = RejectReason.FutureTimestamp;
        if (reason != RejectReason.None)
        {
            Reject(route, topic, reason);
            return reason;
        }
        var ticks = value.Ticks != 0 ? value.Ticks : _time.GetUtcNow().UtcTicks;
        Take(route, ticks, value.Value, value.Quality);
        return RejectReason.None;
    }

    /// <summary>Counts a value of a known route that could not be read (payloads decoded elsewhere, such as Sparkplug metrics).</summary>
    public void Reject(TagRoute route, string topic, RejectReason reason)
    {
        Interlocked.Increment(ref route.Rejected);
        Interlocked.Increment(ref _rejected);
        Interlocked.Increment(ref _rejectedBy[(int)reason]);
        LogReject(topic, reason);
    }

    /// <summary>Counts a message taken by another reader of the same subscription (Sparkplug).</summary>
    public void CountReceived() => Interlocked.Increment(ref _received);

    /// <summary>Takes one decoded value for a known route (the path offline analysis uses).</summary>
    public void Take(TagRoute route, long ticks, double value, SampleQuality quality)
    {
        if (_shared)
        {
            Interlocked.Increment(ref route.Accepted);
            Interlocked.Increment(ref _accepted);
        }
        else
        {
            route.Accepted++;
            _accepted++;
        }
        Clock.Observe(ticks);
        route.Cell.Update(route.Signal, ticks, value, quality);
    }

    /// <summary>Moves every loop's clock to the plant's time now.</summary>
    public void AdvanceAll() => AdvanceTo(Clock.NowTicks);

    /// <summary>Moves every loop's clock to event time <paramref name="nowTicks"/> (offline analysis drives it from the file's timestamps).</summary>
    public void AdvanceTo(long nowTicks)
    {
        foreach (var cell in _cells) cell.Advance(nowTicks);
    }

    /// <inheritdoc />
    public DateTimeOffset Now => new(Clock.NowTicks, TimeSpan.Zero);

    /// <inheritdoc />
    public IReadOnlyList<LoopView> Loops() => _cells.Select(View).ToList();

    /// <inheritdoc />
    public LoopView? Loop(string id) => _byId.TryGetValue(id, out var cell) ? View(cell) : null;

    /// <inheritdoc />
    public IReadOnlyList<TrendPoint> Trend(string id, TimeSpan span) =>
        _byId.TryGetValue(id, out var cell) ? cell.Trend(Clock.NowTicks - span.Ticks) : [];

    /// <inheritdoc />
    public IngestCounters Counters()
    {
        var late = Interlocked.Read(ref _lateOfRetired);
        foreach (var c in _cells) late += c.Read(m => m.Snapshot.LateValues);
        return new IngestCounters(Interlocked.Read(ref _received), Interlocked.Read(ref _accepted), Interlocked.Read(ref _rejected),
            Interlocked.Read(ref _unknown), late, BrokerConnected, Math.Max(0, Interlocked.Read(ref Connections) - 1), RejectedByReason());
    }

    private Dictionary<string, long> RejectedByReason()
    {
        var byReason = new Dictionary<string, long>();
        foreach (var reason in Enum.GetValues<RejectReason>())
            if (RejectedFor(reason) is > 0 and var n) byReason[System.Text.Json.JsonNamingPolicy.SnakeCaseLower.ConvertName(reason.ToString())] = n;
        return byReason;
    }

    /// <summary>Payloads rejected for <paramref name="reason"/> since start.</summary>
    public long RejectedFor(RejectReason reason) => Interlocked.Read(ref _rejectedBy[(int)reason]);

    private static LoopView View(LoopCell cell) => cell.Read(m =>
    {
        var s = m.Spec;
        var snap = m.Snapshot;
        return new LoopView(s.Id, s.Description, s.Area, s.Kind == LoopKind.Pid ? "pid" : "on-off", s.Process.ToString().ToLowerInvariant(), s.Unit,
            s.PvMin, s.PvMax, Finite(snap.Pv), Finite(snap.Sp), Finite(snap.Op), ModeText(snap.Mode, s.ModeTag is not null),
            snap.LastUpdateTicks == 0 ? null : new DateTimeOffset(snap.LastUpdateTicks, TimeSpan.Zero),
            m.Board.Active.ToArray(), m.Statistics(), snap.Samples);
    });

    private static double? Finite(double v) => double.IsFinite(v) ? v : null;

    private static string ModeText(LoopMode mode, bool hasTag) => mode switch
    {
        LoopMode.Manual => "manual",
        LoopMode.Auto => "auto",
        LoopMode.Cascade => "cascade",
        _ => hasTag ? "unknown" : "auto",
    };

    // A kept cell keeps its route objects, and with them the per-tag counters.
    private static Dictionary<string, TagRoute> RoutesOf(LoopCell[] cells, Dictionary<string, TagRoute>? previous)
    {
        var routes = new Dictionary<string, TagRoute>(StringComparer.Ordinal);
        foreach (var cell in cells)
        {
            var s = cell.Spec;
            Add(Signal.Pv, s.PvTag);
            Add(Signal.Op, s.OpTag);
            if (s.SpTag is not null) Add(Signal.Sp, s.SpTag);
            if (s.ModeTag is not null) Add(Signal.Mode, s.ModeTag);
            if (s.PositionTag is not null) Add(Signal.Position, s.PositionTag);

            void Add(Signal signal, string tag)
            {
                if (previous?.GetValueOrDefault(tag) is { } kept && kept.Cell == cell && kept.Signal == signal) { routes[tag] = kept; return; }
                var kind = signal switch
                {
                    Signal.Mode => TagValueKind.Mode,
                    Signal.Op when cell.Spec.Kind == LoopKind.OnOff => TagValueKind.Binary,
                    _ => TagValueKind.Analog,
                };
                routes[tag] = new TagRoute(cell, signal, tag, kind);
            }
        }
        return routes;
    }

    private void LogReject(string topic, RejectReason reason)
    {
        // At most one line per 10 s whatever the rate of bad payloads, so a broken gateway cannot fill the disk.
        var now = _time.GetUtcNow().UtcTicks;
        var next = Interlocked.Read(ref _nextRejectLogTicks);
        if (now < next) { Interlocked.Increment(ref _suppressedRejectLogs); return; }
        if (Interlocked.CompareExchange(ref _nextRejectLogTicks, now + TimeSpan.TicksPerSecond * 10, next) != next) return;
        AgentLog.PayloadRejected(_log, topic, reason, Interlocked.Exchange(ref _suppressedRejectLogs, 0));
    }
}

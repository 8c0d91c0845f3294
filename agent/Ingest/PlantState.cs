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
    private readonly LoopCell[] _cells;
    private readonly Dictionary<string, LoopCell> _byId;
    private readonly Dictionary<string, TagRoute> _routes;
    private readonly TimeProvider _time;
    private readonly ILogger _log;
    private readonly bool _shared;
    private long _received, _accepted, _rejected, _unknown;
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
        _shared = shared;
        _cells = specs.Select(s => new LoopCell(s, findings, hooks, shared)).ToArray();
        _byId = _cells.ToDictionary(c => c.Spec.Id, StringComparer.Ordinal);
        _routes = new Dictionary<string, TagRoute>(StringComparer.Ordinal);
        foreach (var cell in _cells)
        {
            var s = cell.Spec;
            Add(cell, Signal.Pv, s.PvTag);
            Add(cell, Signal.Op, s.OpTag);
            if (s.SpTag is not null) Add(cell, Signal.Sp, s.SpTag);
            if (s.ModeTag is not null) Add(cell, Signal.Mode, s.ModeTag);
            if (s.PositionTag is not null) Add(cell, Signal.Position, s.PositionTag);
        }
    }

    /// <summary>The plant's event clock.</summary>
    public PlantClock Clock { get; }

    /// <summary>Every topic the agent subscribes to.</summary>
    public IReadOnlyCollection<string> Topics => _routes.Keys;

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
        if (reason != RejectReason.None)
        {
            Interlocked.Increment(ref route.Rejected);
            Interlocked.Increment(ref _rejected);
            LogReject(topic, reason);
            return reason;
        }
        var ticks = value.Ticks != 0 ? value.Ticks : _time.GetUtcNow().UtcTicks;
        Take(route, ticks, value.Value, value.Quality);
        return RejectReason.None;
    }

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
        long late = 0;
        foreach (var c in _cells) late += c.Read(m => m.Snapshot.LateValues);
        return new IngestCounters(Interlocked.Read(ref _received), Interlocked.Read(ref _accepted), Interlocked.Read(ref _rejected),
            Interlocked.Read(ref _unknown), late, BrokerConnected, Math.Max(0, Interlocked.Read(ref Connections) - 1));
    }

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

    private void Add(LoopCell cell, Signal signal, string tag)
    {
        var kind = signal switch
        {
            Signal.Mode => TagValueKind.Mode,
            Signal.Op when cell.Spec.Kind == LoopKind.OnOff => TagValueKind.Binary,
            _ => TagValueKind.Analog,
        };
        _routes[tag] = new TagRoute(cell, signal, tag, kind);
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

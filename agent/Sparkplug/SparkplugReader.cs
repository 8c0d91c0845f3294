using System.Threading.Channels;
using Google.Protobuf;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Sparkplug.Wire;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Sparkplug;

/// <summary>
/// Follows the Sparkplug B sessions of the edge nodes that loop tags name and feeds their metrics into the same
/// <see cref="PlantState.Take"/> path as plain topics. Births give aliases and types, data goes by alias or name,
/// deaths make the loops stale at once, sequence gaps and unknown aliases are counted and are reasons for a rebirth,
/// which is queued only when <see cref="SparkplugOptions.RequestRebirth"/> is on. Section numbers in the comments are
/// those of the Eclipse Sparkplug 3.0 specification, as the team remembers them.
/// </summary>
public sealed class SparkplugReader
{
    private readonly object _gate = new();
    private readonly Dictionary<(string Group, string EdgeNode), SparkplugNode> _nodes = [];
    private readonly Dictionary<string, SparkplugTopic> _topics = new(StringComparer.Ordinal);
    private readonly PlantState _plant;
    private readonly SparkplugOptions _options;
    private readonly TimeProvider _time;
    private readonly ILogger _log;
    private readonly Channel<string> _rebirths = Channel.CreateBounded<string>(new BoundedChannelOptions(64) { FullMode = BoundedChannelFullMode.DropWrite });
    private long _messages, _births, _deaths, _oldDeaths, _gaps, _unknownAliases, _beforeBirth, _malformed, _historical, _needed, _sent, _held;

    /// <summary>A reader for every loop tag of <paramref name="plant"/> that names a Sparkplug metric.</summary>
    public SparkplugReader(PlantState plant, SparkplugOptions options, TimeProvider time, ILogger<SparkplugReader> log)
    {
        _plant = plant;
        _options = options;
        _time = time;
        _log = log;
        Reroute(plant.Routes);
    }

    /// <summary>The subscriptions that cover every edge node a loop tag names (4.1 "Topic Namespace Elements").</summary>
    public IReadOnlyList<string> Filters
    {
        get { lock (_gate) return Filter(_nodes.Keys); }
    }

    /// <summary>
    /// Takes the loop tags of a reloaded configuration: each metric feeds its new route at once; an edge node no loop
    /// names any more is dropped. A node that stays keeps its session (birth, aliases, sequence), so a metric newly
    /// named on a born node is read from its next data message. Returns the edge-node subscriptions to add and to drop.
    /// </summary>
    public (IReadOnlyList<string> Added, IReadOnlyList<string> Dropped) Reroute(IReadOnlyDictionary<string, TagRoute> routes)
    {
        lock (_gate)
        {
            var before = _nodes.Keys.ToHashSet();
            foreach (var node in _nodes.Values)
                foreach (var device in node.Devices.Values) device.Routes.Clear();
            var named = new HashSet<(string, string)>();
            foreach (var route in routes.Values)
            {
                if (!SparkplugTag.TryParse(route.Tag, out var tag, out _)) continue;
                Node(tag.Group, tag.EdgeNode).Device(tag.Device).Routes[tag.Metric] = route;
                named.Add((tag.Group, tag.EdgeNode));
            }
            foreach (var key in _nodes.Keys.Where(k => !named.Contains(k)).ToList()) _nodes.Remove(key);
            return (Filter(_nodes.Keys.Where(k => !before.Contains(k))), Filter(before.Where(k => !named.Contains(k))));
        }
    }

    private static string[] Filter(IEnumerable<(string Group, string EdgeNode)> nodes) =>
        nodes.Select(n => SparkplugTopic.EdgeNodeFilter(n.Group, n.EdgeNode)).ToArray();

    /// <summary>The NCMD topics of rebirth requests waiting to be published (only ever written with the option on).</summary>
    public ChannelReader<string> RebirthRequests => _rebirths.Reader;

    /// <summary>True for topics of the Sparkplug namespace, which this reader takes instead of the plain payload rules.</summary>
    public static bool Owns(string topic) => SparkplugTag.IsSparkplug(topic);

    /// <summary>The counters since start.</summary>
    public SparkplugCounters Counters() => new(Read(ref _messages), Read(ref _births), Read(ref _deaths), Read(ref _oldDeaths), Read(ref _gaps),
        Read(ref _unknownAliases), Read(ref _beforeBirth), Read(ref _malformed), Read(ref _historical), Read(ref _needed), Read(ref _sent), Read(ref _held));

    /// <summary>Each followed edge node with its devices: whether born, online, and the last sequence number.</summary>
    public object Nodes()
    {
        lock (_gate)
            return _nodes.Values.Select(n => new
            {
                group = n.Group, edge_node = n.EdgeNode, born = n.Born, last_seq = n.LastSeq < 0 ? (int?)null : n.LastSeq,
                devices = n.Devices.Where(d => d.Key.Length > 0).Select(d => new { device = d.Key, online = d.Value.Online, aliases = d.Value.Aliases.Count }).ToArray(),
            }).ToArray();
    }

    /// <summary>Notes that a queued rebirth request went out.</summary>
    public void RebirthSent() => Interlocked.Increment(ref _sent);

    /// <summary>Takes one message of the Sparkplug namespace.</summary>
    public void Ingest(string topic, ReadOnlySpan<byte> bytes)
    {
        Interlocked.Increment(ref _messages);
        _plant.CountReceived();
        // Commands are for the edge nodes (our own rebirth requests come back here too); STATE is for primary hosts.
        if (!TryTopic(topic, out var t) || t.Type is SparkplugMessageType.NCmd or SparkplugMessageType.DCmd) return;
        Payload payload;
        try
        {
            payload = Payload.Parser.ParseFrom(bytes);
        }
        catch (InvalidProtocolBufferException e)
        {
            Interlocked.Increment(ref _malformed);
            SparkplugLog.Malformed(_log, topic, e.Message);
            return;
        }
        string? rebirthReason;
        SparkplugNode node;
        lock (_gate)
        {
            if (!_nodes.TryGetValue((t.Group, t.EdgeNode), out var found)) return;
            node = found;
            rebirthReason = Take(node, t, topic, payload);
        }
        if (rebirthReason is not null) NeedRebirth(node, rebirthReason);
    }

    private bool TryTopic(string topic, out SparkplugTopic t)
    {
        // The same few topics come again and again: parse each once (bounded, as a broker could send any number).
        lock (_gate)
            if (_topics.TryGetValue(topic, out t)) return true;
        if (!SparkplugTopic.TryParse(topic, out t)) return false;
        lock (_gate)
            if (_topics.Count < 10_000) _topics[topic] = t;
        return true;
    }

    private string? Take(SparkplugNode node, SparkplugTopic t, string topic, Payload payload)
    {
        switch (t.Type)
        {
            case SparkplugMessageType.NBirth:
                // 5.4 "Edge Node Session Establishment": an NBIRTH starts a new session; every earlier birth is void.
                foreach (var d in node.Devices.Values) d.Forget();
                node.Born = true;
                node.OutOfStep = false;
                node.LastSeq = payload.HasSeq ? (int)(payload.Seq & 0xFF) : -1;
                node.BirthDeathSeq = BdSeq(payload);
                Interlocked.Increment(ref _births);
                SparkplugLog.Birth(_log, node.Device(null).Source, payload.Metrics.Count);
                return Metrics(node.Device(null), topic, payload, birth: true);
            case SparkplugMessageType.NDeath:
            {
                // 6.4.24 "NDEATH": the will carries the bdSeq of its session; a death from an older session is not news.
                var bdSeq = BdSeq(payload);
                if (node.BirthDeathSeq is { } current && bdSeq is { } seq && seq != current)
                {
                    Interlocked.Increment(ref _oldDeaths);
                    SparkplugLog.OldDeath(_log, node.Device(null).Source, seq);
                    return null;
                }
                // The will was set at connect time, so its timestamp is not the time of death: the plant's clock is.
                var ticks = _plant.Clock.NowTicks;
                node.Born = false;
                node.LastSeq = -1;
                foreach (var d in node.Devices.Values)
                {
                    d.Forget();
                    Lose(d, ticks);
                }
                Interlocked.Increment(ref _deaths);
                SparkplugLog.Death(_log, node.Device(null).Source);
                return null;
            }
        }

        var reason = Sequence(node, payload);
        if (!node.Born)
        {
            // 5.x host behaviour: data from a node whose birth this host never saw cannot be trusted to be complete.
            Interlocked.Increment(ref _beforeBirth);
            reason ??= "no birth seen";
        }
        var device = node.Device(t.Device);
        switch (t.Type)
        {
            case SparkplugMessageType.DBirth:
                // 5.6 "Device Session Establishment".
                device.Forget();
                device.Online = true;
                Interlocked.Increment(ref _births);
                SparkplugLog.Birth(_log, device.Source, payload.Metrics.Count);
                return Metrics(device, topic, payload, birth: true) ?? reason;
            case SparkplugMessageType.DDeath:
            {
                // 5.7 "Device Session Termination": the device's metrics are stale from the death's own time.
                var ticks = SparkplugValue.Ticks(payload);
                device.Forget();
                Lose(device, ticks != 0 ? ticks : _plant.Clock.NowTicks);
                Interlocked.Increment(ref _deaths);
                SparkplugLog.Death(_log, device.Source);
                return reason;
            }
            default:
                return Metrics(device, topic, payload, birth: false) ?? reason;
        }
    }

    private string? Sequence(SparkplugNode node, Payload payload)
    {
        // 6.4.4 "Payload" seq: every message after the NBIRTH carries the previous one's seq + 1, 255 wrapping to 0.
        var seq = payload.HasSeq && payload.Seq <= 255 ? (int)payload.Seq : -1;
        var last = node.LastSeq;
        node.LastSeq = seq;
        if (last < 0) return null;
        if (seq == ((last + 1) & 0xFF)) return null;
        Interlocked.Increment(ref _gaps);
        return seq < 0 ? "message without a sequence number" : $"sequence gap: {seq} after {last}";
    }

    private string? Metrics(SparkplugDevice device, string topic, Payload payload, bool birth)
    {
        string? reason = null;
        var received = 0L;
        foreach (var metric in payload.Metrics)
        {
            string name;
            DataType type;
            if (metric.HasName && metric.Name.Length > 0)
            {
                name = metric.Name;
                type = metric.HasDatatype ? (DataType)metric.Datatype : device.Types.GetValueOrDefault(name);
                if (birth)
                {
                    // 6.4.18/6.4.19 NBIRTH/DBIRTH: every metric with name and type, and its alias when the node uses aliases.
                    device.Types[name] = type;
                    if (metric.HasAlias) device.Aliases[metric.Alias] = (name, type);
                }
            }
            else if (metric.HasAlias && device.Aliases.TryGetValue(metric.Alias, out var known))
            {
                (name, type) = known;
                if (metric.HasDatatype) type = (DataType)metric.Datatype;
            }
            else
            {
                // 6.4.5: an alias only means something after the birth that declared it.
                Interlocked.Increment(ref _unknownAliases);
                reason ??= metric.HasAlias ? $"unknown alias {metric.Alias}" : "metric without name or alias";
                continue;
            }
            if (!device.Routes.TryGetValue(name, out var route)) continue;
            if (metric.HasIsHistorical && metric.IsHistorical)
            {
                // Historical values are back-fill, not the present state of the loop.
                Interlocked.Increment(ref _historical);
                continue;
            }
            var rejected = SparkplugValue.Read(metric, type, route.ValueKind, out var value, out var quality);
            if (rejected != RejectReason.None)
            {
                _plant.Reject(route, topic, rejected);
                continue;
            }
            var ticks = SparkplugValue.Ticks(payload, metric);
            if (ticks == 0) ticks = received != 0 ? received : received = _time.GetUtcNow().UtcTicks;
            _plant.Take(route, ticks, value, quality);
        }
        return reason;
    }

    private void Lose(SparkplugDevice device, long ticks)
    {
        _plant.Clock.Observe(ticks);
        foreach (var route in device.Routes.Values) route.Cell.SourceLost(route.Signal, ticks, device.Source);
    }

    private void NeedRebirth(SparkplugNode node, string reason)
    {
        Interlocked.Increment(ref _needed);
        var source = $"{node.Group}/{node.EdgeNode}";
        if (!_options.RequestRebirth)
        {
            // Read-only by default: the reason is counted and logged once per session, nothing is written.
            lock (_gate)
            {
                if (node.OutOfStep) return;
                node.OutOfStep = true;
            }
            SparkplugLog.OutOfStep(_log, source, reason, "rebirth requests are off (Sparkplug:RequestRebirth)");
            return;
        }
        var now = _time.GetUtcNow().UtcTicks;
        lock (_gate)
        {
            if (now < node.NextRebirthTicks) { Interlocked.Increment(ref _held); return; }
            node.NextRebirthTicks = now + (long)(_options.RebirthMinSeconds * TimeSpan.TicksPerSecond);
        }
        SparkplugLog.OutOfStep(_log, source, reason, "requesting a rebirth");
        if (!_rebirths.Writer.TryWrite(new SparkplugTopic(node.Group, SparkplugMessageType.NCmd, node.EdgeNode, null).ToString()))
            Interlocked.Increment(ref _held);
    }

    private static ulong? BdSeq(Payload payload)
    {
        // 6.4.18 "NBIRTH" and 6.4.24 "NDEATH": the birth/death sequence travels as a metric named bdSeq.
        foreach (var m in payload.Metrics)
            if (m.Name == "bdSeq") return m.ValueCase == Payload.Types.Metric.ValueOneofCase.LongValue ? m.LongValue : m.IntValue;
        return null;
    }

    private SparkplugNode Node(string group, string edgeNode)
    {
        if (!_nodes.TryGetValue((group, edgeNode), out var node)) _nodes[(group, edgeNode)] = node = new SparkplugNode(group, edgeNode);
        return node;
    }

    private static long Read(ref long counter) => Interlocked.Read(ref counter);
}

using Google.Protobuf;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Sparkplug;
using LoopWatch.Agent.Sparkplug.Wire;

namespace LoopWatch.Agent.Discovery;

/// <summary>
/// Everything discovery heard: plain topics read by the agent's payload rules, and Sparkplug B metrics named by
/// their births (aliases resolved from births seen while listening). Thread-safe: MQTT delivers on its own thread.
/// </summary>
public sealed class TopicSurvey
{
    private readonly object _gate = new();
    private readonly Dictionary<string, ObservedTopic> _topics = new(StringComparer.Ordinal);
    private readonly Dictionary<string, Dictionary<ulong, (string Name, DataType Type)>> _aliases = new(StringComparer.Ordinal);

    /// <summary>Messages heard.</summary>
    public long Messages { get; private set; }

    /// <summary>Sparkplug data whose aliases no birth seen had declared (the edge node was born before discovery listened).</summary>
    public long UnknownAliases { get; private set; }

    /// <summary>The topics in tag order.</summary>
    public IReadOnlyList<ObservedTopic> Topics()
    {
        lock (_gate) return _topics.Values.OrderBy(t => t.Tag, StringComparer.Ordinal).ToList();
    }

    /// <summary>Takes one message.</summary>
    public void Observe(string topic, ReadOnlySpan<byte> payload)
    {
        lock (_gate)
        {
            Messages++;
            if (SparkplugTopic.TryParse(topic, out var sp)) ObserveSparkplug(sp, payload);
            else if (!SparkplugTag.IsSparkplug(topic)) ObservePlain(Topic(topic), payload);
        }
    }

    private void ObservePlain(ObservedTopic t, ReadOnlySpan<byte> payload)
    {
        // The agent's own payload rules: what it could not read live is not proposed either.
        if (PayloadDecoder.Decode(payload, TagValueKind.Analog, out var v) == RejectReason.None) t.Number(v.Value);
        else if (PayloadDecoder.Decode(payload, TagValueKind.Binary, out _) == RejectReason.None) t.Boolean();
        else if (PayloadDecoder.Decode(payload, TagValueKind.Mode, out _) == RejectReason.None) t.ModeWord();
        else t.Unread();
    }

    private void ObserveSparkplug(SparkplugTopic sp, ReadOnlySpan<byte> bytes)
    {
        if (sp.Type is SparkplugMessageType.NCmd or SparkplugMessageType.DCmd or SparkplugMessageType.NDeath or SparkplugMessageType.DDeath) return;
        Payload payload;
        try { payload = Payload.Parser.ParseFrom(bytes); }
        catch (InvalidProtocolBufferException) { return; }
        var prefix = $"{SparkplugTag.Namespace}/{sp.Group}/{sp.EdgeNode}{(sp.Device is null ? "" : "/" + sp.Device)}:";
        var birth = sp.Type is SparkplugMessageType.NBirth or SparkplugMessageType.DBirth;
        if (!_aliases.TryGetValue(prefix, out var aliases) || birth) _aliases[prefix] = aliases = [];
        foreach (var m in payload.Metrics)
        {
            string name;
            var type = (DataType)m.Datatype;
            if (m.HasName && m.Name.Length > 0)
            {
                name = m.Name;
                if (birth && m.HasAlias) aliases[m.Alias] = (name, type);
            }
            else if (m.HasAlias && aliases.TryGetValue(m.Alias, out var known)) (name, type) = known;
            else { UnknownAliases++; continue; }
            if (name == "bdSeq" || name.StartsWith("Node Control/", StringComparison.Ordinal)) continue;
            var t = Topic(prefix + name);
            if (m.ValueCase == Payload.Types.Metric.ValueOneofCase.BooleanValue) { t.Boolean(); continue; }
            if (SparkplugValue.Read(m, type, TagValueKind.Analog, out var v, out _) == RejectReason.None && double.IsFinite(v)) t.Number(v);
            else if (m.ValueCase == Payload.Types.Metric.ValueOneofCase.StringValue
                && SparkplugValue.Read(m, type, TagValueKind.Mode, out _, out _) == RejectReason.None) t.ModeWord();
            else t.Unread();
        }
    }

    private ObservedTopic Topic(string tag)
    {
        if (!_topics.TryGetValue(tag, out var t)) _topics[tag] = t = new ObservedTopic(tag);
        return t;
    }
}

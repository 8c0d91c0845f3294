namespace LoopWatch.Agent.Sparkplug;

/// <summary>
/// A Sparkplug B topic, <c>spBv1.0/&lt;group&gt;/&lt;message type&gt;/&lt;edge node&gt;[/&lt;device&gt;]</c>
/// (Sparkplug 3.0, 4.1 "Topic Namespace Elements"); <see cref="Device"/> is null for node messages.
/// </summary>
public readonly record struct SparkplugTopic(string Group, SparkplugMessageType Type, string EdgeNode, string? Device)
{
    /// <summary>The topic of a message of this kind.</summary>
    public override string ToString() =>
        $"{SparkplugTag.Namespace}/{Group}/{Type.ToString().ToUpperInvariant()}/{EdgeNode}{(Device is null ? "" : "/" + Device)}";

    /// <summary>The subscription that covers every message of one edge node and its devices.</summary>
    public static string EdgeNodeFilter(string group, string edgeNode) => $"{SparkplugTag.Namespace}/{group}/+/{edgeNode}/#";

    /// <summary>Parses a topic; false for anything that is not a node or device message (STATE, other namespaces).</summary>
    public static bool TryParse(string topic, out SparkplugTopic result)
    {
        result = default;
        if (!SparkplugTag.IsSparkplug(topic)) return false;
        var parts = topic.Split('/');
        if (parts.Length is < 4 or > 5 || parts[1].Length == 0 || parts[3].Length == 0) return false;
        SparkplugMessageType? type = parts[2] switch
        {
            "NBIRTH" => SparkplugMessageType.NBirth,
            "NDEATH" => SparkplugMessageType.NDeath,
            "NDATA" => SparkplugMessageType.NData,
            "NCMD" => SparkplugMessageType.NCmd,
            "DBIRTH" => SparkplugMessageType.DBirth,
            "DDEATH" => SparkplugMessageType.DDeath,
            "DDATA" => SparkplugMessageType.DData,
            "DCMD" => SparkplugMessageType.DCmd,
            _ => null,
        };
        if (type is not { } t) return false;
        var deviceMessage = t is SparkplugMessageType.DBirth or SparkplugMessageType.DDeath or SparkplugMessageType.DData or SparkplugMessageType.DCmd;
        // Device messages carry a device id, node messages do not (4.1.5 "device_id Element").
        if (deviceMessage != (parts.Length == 5) || (deviceMessage && parts[4].Length == 0)) return false;
        result = new SparkplugTopic(parts[1], t, parts[3], deviceMessage ? parts[4] : null);
        return true;
    }
}

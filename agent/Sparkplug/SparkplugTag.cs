namespace LoopWatch.Agent.Sparkplug;

/// <summary>
/// A loop tag naming a Sparkplug B metric: <c>spBv1.0/&lt;group&gt;/&lt;edge node&gt;/&lt;device&gt;:&lt;metric name&gt;</c>,
/// or <c>spBv1.0/&lt;group&gt;/&lt;edge node&gt;:&lt;metric name&gt;</c> for a metric of the edge node itself.
/// The first <c>:</c> ends the topic part, so metric names may hold <c>/</c> and <c>:</c>; ids may not hold <c>:</c>.
/// </summary>
public readonly record struct SparkplugTag(string Group, string EdgeNode, string? Device, string Metric)
{
    /// <summary>The Sparkplug B topic namespace (Sparkplug 3.0, 4.1.1 "namespace Element").</summary>
    public const string Namespace = "spBv1.0";

    /// <summary>True when the tag is meant as a Sparkplug metric (starts with the namespace).</summary>
    public static bool IsSparkplug(string tag) => tag.StartsWith(Namespace + "/", StringComparison.Ordinal);

    /// <summary>The node or device the metric comes from, as people read it: <c>group/edge</c> or <c>group/edge/device</c>.</summary>
    public string Source => Device is null ? $"{Group}/{EdgeNode}" : $"{Group}/{EdgeNode}/{Device}";

    /// <summary>Parses a Sparkplug tag; <paramref name="problem"/> says what is wrong when it returns false.</summary>
    public static bool TryParse(string tag, out SparkplugTag result, out string? problem)
    {
        result = default;
        problem = null;
        if (!IsSparkplug(tag)) { problem = $"does not start with '{Namespace}/'"; return false; }
        var colon = tag.IndexOf(':');
        if (colon < 0 || colon == tag.Length - 1) { problem = "has no ':<metric name>' after the node or device"; return false; }
        var ids = tag[(Namespace.Length + 1)..colon].Split('/');
        if (ids.Length is < 2 or > 3) { problem = "must be spBv1.0/<group>/<edge node>[/<device>]:<metric name>"; return false; }
        foreach (var id in ids)
        {
            // Sparkplug 3.0, 4.1.2-4.1.5: ids are non-empty and hold no MQTT separator or wildcard.
            if (id.Length == 0 || id.IndexOfAny(['+', '#']) >= 0) { problem = $"id '{id}' must be non-empty without '+' or '#'"; return false; }
        }
        result = new SparkplugTag(ids[0], ids[1], ids.Length == 3 ? ids[2] : null, tag[(colon + 1)..]);
        return true;
    }
}

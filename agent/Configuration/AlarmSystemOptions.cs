namespace LoopWatch.Agent.Configuration;

/// <summary>
/// The <c>LoopWatch:AlarmSystem</c> section: the loop-health topics published back to the broker and retention.
/// Defaults: <see cref="HealthNamespace"/> <c>loopwatch</c> (topics <c>loopwatch/&lt;loop id&gt;/health</c>),
/// <see cref="PublishHealth"/> true, <see cref="HealthIntervalSeconds"/> 10, <see cref="RetentionDays"/> 400.
/// </summary>
public sealed class AlarmSystemOptions
{
    /// <summary>Topic root of the retained health messages; must not overlap any loop tag.</summary>
    public string HealthNamespace { get; set; } = "loopwatch";

    /// <summary>Publish each loop's health as retained JSON through the agent's own MQTT client.</summary>
    public bool PublishHealth { get; set; } = true;

    /// <summary>Wall seconds between health publications.</summary>
    public double HealthIntervalSeconds { get; set; } = 10;

    /// <summary>Hourly statistics and alarm journal rows older than this many days of plant time are pruned.</summary>
    public int RetentionDays { get; set; } = 400;

    /// <summary>The problems of these options against the configured loop tags, each naming its key.</summary>
    public IEnumerable<string> Check(IEnumerable<string> loopTags)
    {
        var ns = HealthNamespace?.Trim('/') ?? "";
        if (ns.Length == 0) yield return "AlarmSystem:HealthNamespace: is missing";
        else if (ns.IndexOfAny(['+', '#']) >= 0) yield return $"AlarmSystem:HealthNamespace: '{ns}' must not contain MQTT wildcards";
        else
        {
            // The agent must never publish on a control tag: refuse a namespace that is, contains or lies under one.
            foreach (var tag in loopTags)
                if (tag == ns || tag.StartsWith(ns + "/", StringComparison.Ordinal) || ns.StartsWith(tag + "/", StringComparison.Ordinal))
                {
                    yield return $"AlarmSystem:HealthNamespace: '{ns}' overlaps the loop tag '{tag}'";
                    break;
                }
        }
        if (!(HealthIntervalSeconds >= 1 && double.IsFinite(HealthIntervalSeconds))) yield return "AlarmSystem:HealthIntervalSeconds: must be at least 1";
        if (RetentionDays < 1) yield return "AlarmSystem:RetentionDays: must be at least 1";
    }
}

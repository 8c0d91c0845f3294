using LoopWatch.Agent.Sparkplug;

namespace LoopWatch.Agent.Configuration;

/// <summary>
/// The <c>LoopWatch:Sparkplug</c> section. LoopWatch reads Sparkplug B as a plain (non-primary) host application; the
/// only thing it can ever write is a rebirth request, and only with <see cref="RequestRebirth"/> on.
/// Defaults: <see cref="RequestRebirth"/> false, <see cref="RebirthMinSeconds"/> 60.
/// </summary>
public sealed class SparkplugOptions
{
    /// <summary>Send an NCMD <c>Node Control/Rebirth</c> to an edge node whose aliases or sequence numbers the agent lost; off by default, since it writes to the edge node.</summary>
    public bool RequestRebirth { get; set; }

    /// <summary>Wall seconds between two rebirth requests to the same edge node.</summary>
    public double RebirthMinSeconds { get; set; } = 60;

    /// <summary>The problems of these options and of the Sparkplug loop tags, each naming its key.</summary>
    public IEnumerable<string> Check(IEnumerable<(string Key, string Tag)> loopTags)
    {
        if (!(RebirthMinSeconds >= 1 && double.IsFinite(RebirthMinSeconds))) yield return "Sparkplug:RebirthMinSeconds: must be at least 1";
        foreach (var (key, tag) in loopTags)
            if (SparkplugTag.IsSparkplug(tag) && !SparkplugTag.TryParse(tag, out _, out var problem))
                yield return $"{key}: Sparkplug tag '{tag}' {problem}";
    }
}

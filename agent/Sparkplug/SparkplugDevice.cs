using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Sparkplug.Wire;

namespace LoopWatch.Agent.Sparkplug;

/// <summary>What the agent knows of one device, or of the edge node's own metrics: its birth aliases and the loop tags it feeds.</summary>
public sealed class SparkplugDevice(string source)
{
    /// <summary><c>group/edge</c> or <c>group/edge/device</c>, for logs and findings.</summary>
    public string Source { get; } = source;

    /// <summary>Loop tags on this device's metrics, by metric name (fixed by the configuration).</summary>
    public Dictionary<string, TagRoute> Routes { get; } = new(StringComparer.Ordinal);

    /// <summary>Metric name and type by alias, from the last birth (Sparkplug 3.0, 6.4.5 "Metric": alias).</summary>
    public Dictionary<ulong, (string Name, DataType Type)> Aliases { get; } = [];

    /// <summary>Metric type by name, from the last birth, for data messages that leave the type out.</summary>
    public Dictionary<string, DataType> Types { get; } = new(StringComparer.Ordinal);

    /// <summary>True between a birth and a death.</summary>
    public bool Online { get; set; }

    /// <summary>Forgets the last birth (a new birth or the node's death makes it void).</summary>
    public void Forget()
    {
        Aliases.Clear();
        Types.Clear();
        Online = false;
    }
}

using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Configuration;

/// <summary>The <c>LoopWatch</c> section of the configuration.</summary>
public sealed class AgentOptions
{
    public BrokerOptions Broker { get; set; } = new();
    public DashboardOptions Dashboard { get; set; } = new();

    /// <summary>Folder of the database; default <c>./data</c>.</summary>
    public string DataDir { get; set; } = "data";

    public ValveOptions Valves { get; set; } = new();

    public List<LoopOptions> Loops { get; set; } = [];

    public AlarmSystemOptions AlarmSystem { get; set; } = new();

    public SparkplugOptions Sparkplug { get; set; } = new();

    public ShardOptions Shard { get; set; } = new();

    /// <summary>Every configured loop's id and area in file order, all shards included (for plant-wide weekly figures).</summary>
    public IReadOnlyList<KeyValuePair<string, string>> LoopAreas() =>
        Loops.Select(l => KeyValuePair.Create(l.Id ?? "", l.Area ?? "")).ToList();
}

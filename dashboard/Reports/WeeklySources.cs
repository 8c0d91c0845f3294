namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// What the weekly page reads besides this agent's own database: the databases of the other agents sharing the plant
/// by shard (read-only), and the area of every loop the plant configures, so loops of other shards are placed too.
/// </summary>
public sealed record WeeklySources(IReadOnlyList<string> Databases, IReadOnlyList<KeyValuePair<string, string>> Areas)
{
    /// <summary>This agent's database alone, with the areas of the loops it watches.</summary>
    public static WeeklySources OwnOnly { get; } = new([], []);
}

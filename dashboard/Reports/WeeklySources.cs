namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// What the weekly page reads besides this agent's own database: the databases of the other agents sharing the plant
/// by shard (read-only), and the area of every loop the plant configures, so loops of other shards are placed too.
/// </summary>
public sealed class WeeklySources(IReadOnlyList<string> databases, IReadOnlyList<KeyValuePair<string, string>> areas)
{
    private IReadOnlyList<KeyValuePair<string, string>> _areas = areas;

    /// <summary>This agent's database alone, with the areas of the loops it watches.</summary>
    public static WeeklySources OwnOnly { get; } = new([], []);

    /// <summary>The other shards' database files.</summary>
    public IReadOnlyList<string> Databases { get; } = databases;

    /// <summary>Every configured loop's id and area; empty means the loops this agent watches, as they are now.</summary>
    public IReadOnlyList<KeyValuePair<string, string>> Areas => Volatile.Read(ref _areas);

    /// <summary>Takes the areas of a reloaded configuration (a loop moved to another area, added or removed), when other shards are read.</summary>
    public void Reconfigure(IReadOnlyList<KeyValuePair<string, string>> areas)
    {
        if (Databases.Count > 0) Volatile.Write(ref _areas, areas);
    }
}

using System.Text.Json;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Configuration;

/// <summary>How a new set of loops differs from the running one, by loop id: added, removed, changed (any key differs) and kept.</summary>
public sealed record LoopSetChange(IReadOnlySet<string> Added, IReadOnlySet<string> Removed, IReadOnlySet<string> Changed, IReadOnlySet<string> Kept)
{
    /// <summary>True when nothing differs.</summary>
    public bool None => Added.Count == 0 && Removed.Count == 0 && Changed.Count == 0;

    /// <summary>Compares by id; two specs are the same when every checked setting (defaults applied) is equal.</summary>
    public static LoopSetChange Between(IEnumerable<LoopSpec> running, IEnumerable<LoopSpec> next)
    {
        var before = running.ToDictionary(s => s.Id, StringComparer.Ordinal);
        var after = next.ToDictionary(s => s.Id, StringComparer.Ordinal);
        HashSet<string> added = [], removed = [], changed = [], kept = [];
        foreach (var (id, spec) in after)
        {
            if (!before.TryGetValue(id, out var old)) added.Add(id);
            else if (Same(old, spec)) kept.Add(id);
            else changed.Add(id);
        }
        foreach (var id in before.Keys) if (!after.ContainsKey(id)) removed.Add(id);
        return new LoopSetChange(added, removed, changed, kept);
    }

    // Specs hold lists and dictionaries, which records compare by reference; their JSON form compares by value.
    private static bool Same(LoopSpec a, LoopSpec b) => ReferenceEquals(a, b) || JsonSerializer.Serialize(a) == JsonSerializer.Serialize(b);
}

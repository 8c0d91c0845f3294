using System.Text;

namespace LoopWatch.Agent.Configuration;

/// <summary>
/// The <c>LoopWatch:Shard</c> section: several agents share one plant, each taking the loops whose id hashes to its
/// <see cref="Index"/> (FNV-1a 32-bit over the UTF-8 loop id, modulo <see cref="Count"/>) and subscribing only to their
/// tags. Defaults: <see cref="Index"/> 0, <see cref="Count"/> 1 (one agent takes every loop).
/// </summary>
public sealed class ShardOptions
{
    /// <summary>This agent's shard, 0 to <see cref="Count"/> - 1.</summary>
    public int Index { get; set; }

    /// <summary>How many agents share the plant; every agent must be given the same count and the same loop list.</summary>
    public int Count { get; set; } = 1;

    /// <summary>True when the loop <paramref name="loopId"/> belongs to this agent.</summary>
    public bool Takes(string loopId) => Count <= 1 || ShardOf(loopId, Count) == Index;

    /// <summary>The shard of a loop: FNV-1a 32-bit of its UTF-8 id, modulo <paramref name="count"/>; the same on every machine and run.</summary>
    public static int ShardOf(string loopId, int count) => (int)(Fnv1a32(Encoding.UTF8.GetBytes(loopId)) % (uint)count);

    /// <summary>FNV-1a, 32-bit: offset basis 2166136261, prime 16777619 (Fowler, Noll and Vo).</summary>
    public static uint Fnv1a32(ReadOnlySpan<byte> data)
    {
        var hash = 2166136261u;
        foreach (var b in data) hash = (hash ^ b) * 16777619u;
        return hash;
    }

    /// <summary>The problems of these settings, each naming its key.</summary>
    public IEnumerable<string> Check()
    {
        if (Count < 1) yield return $"Shard:Count: {Count} must be at least 1";
        else if (Index < 0 || Index >= Count) yield return $"Shard:Index: {Index} is not a shard of Shard:Count {Count} (0 to {Count - 1})";
    }
}

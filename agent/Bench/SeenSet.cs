namespace LoopWatch.Agent.Bench;

/// <summary>Which sequence numbers have arrived: a bit per number in lazily allocated chunks, safe for concurrent writers.</summary>
internal sealed class SeenSet
{
    private const int ChunkBits = 1 << 20;
    private readonly long[]?[] _chunks = new long[]?[1 << 16];

    /// <summary>Marks <paramref name="seq"/>; false when it was already marked (a doubled message).</summary>
    public bool Add(long seq)
    {
        var chunkIndex = (int)(seq / ChunkBits);
        if ((uint)chunkIndex >= (uint)_chunks.Length) return true; // beyond 68 billion messages: count, do not track
        var chunk = Volatile.Read(ref _chunks[chunkIndex]);
        if (chunk is null)
        {
            Interlocked.CompareExchange(ref _chunks[chunkIndex], new long[ChunkBits / 64], null);
            chunk = _chunks[chunkIndex]!;
        }
        var bit = seq % ChunkBits;
        var mask = 1L << (int)(bit & 63);
        return (Interlocked.Or(ref chunk[bit >> 6], mask) & mask) == 0;
    }
}

using System.Diagnostics;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// What one consumer (the agent or the bare subscriber) got: distinct and doubled messages by sequence number, the time
/// of the last one, and latencies from publish for messages from <see cref="TimeFrom"/> on.
/// </summary>
internal sealed class Tally
{
    private readonly SeenSet _seen = new();
    private long _count, _duplicates, _lastTicks, _windowMax;

    /// <summary>Latency from publish to this consumer.</summary>
    public LatencyHistogram Latency { get; } = new();

    /// <summary>Messages with a lower sequence number (the warm-up) are counted but not timed.</summary>
    public long TimeFrom;

    /// <summary>Distinct messages taken.</summary>
    public long Count => Interlocked.Read(ref _count);

    /// <summary>Messages taken more than once.</summary>
    public long Duplicates => Interlocked.Read(ref _duplicates);

    /// <summary>Stopwatch time of the last message taken.</summary>
    public long LastTicks => Interlocked.Read(ref _lastTicks);

    /// <summary>Takes the correlation data the generator put on a message; anything else is ignored.</summary>
    public void Take(byte[]? correlation)
    {
        if (!BenchStamp.TryRead(correlation, out var seq, out var sent)) return;
        var now = Stopwatch.GetTimestamp();
        if (!_seen.Add(seq)) { Interlocked.Increment(ref _duplicates); return; }
        Interlocked.Increment(ref _count);
        Volatile.Write(ref _lastTicks, now);
        var latency = now - sent;
        if (seq >= Volatile.Read(ref TimeFrom)) Latency.Record(latency);
        // A running maximum per progress line shows whether the tail comes in bursts (a pause) or spreads evenly.
        for (var seen = Volatile.Read(ref _windowMax); latency > seen; seen = Volatile.Read(ref _windowMax))
            if (Interlocked.CompareExchange(ref _windowMax, latency, seen) == seen) break;
    }

    /// <summary>The longest latency since the last call, in milliseconds, and starts a new window.</summary>
    public double TakeWindowMaxMs() => Interlocked.Exchange(ref _windowMax, 0) * 1000.0 / Stopwatch.Frequency;
}

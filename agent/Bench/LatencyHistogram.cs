namespace LoopWatch.Agent.Bench;

/// <summary>Latencies in logarithmic buckets about 1 % wide (from 1 microsecond to hours), for percentiles without keeping every value.</summary>
internal sealed class LatencyHistogram
{
    private const double PerLog = 100; // buckets per unit of ln(microseconds): about 1 % relative width
    private readonly long[] _buckets = new long[(int)(Math.Log(1e10) * PerLog) + 2];
    private long _count;

    /// <summary>Values recorded.</summary>
    public long Count => Interlocked.Read(ref _count);

    /// <summary>Records one latency in Stopwatch ticks.</summary>
    public void Record(long stopwatchTicks)
    {
        var us = Math.Max(1.0, stopwatchTicks * 1e6 / System.Diagnostics.Stopwatch.Frequency);
        var i = Math.Min(_buckets.Length - 1, (int)(Math.Log(us) * PerLog));
        Interlocked.Increment(ref _buckets[i]);
        Interlocked.Increment(ref _count);
    }

    /// <summary>The <paramref name="quantile"/> (0..1) in milliseconds, upper edge of its bucket; null when empty.</summary>
    public double? Percentile(double quantile)
    {
        var total = Count;
        if (total == 0) return null;
        var rank = (long)Math.Ceiling(quantile * total);
        long seen = 0;
        for (var i = 0; i < _buckets.Length; i++)
        {
            seen += Interlocked.Read(ref _buckets[i]);
            if (seen >= rank) return Math.Exp((i + 1) / PerLog) / 1000;
        }
        return Math.Exp(_buckets.Length / PerLog) / 1000;
    }
}

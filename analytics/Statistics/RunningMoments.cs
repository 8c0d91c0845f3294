namespace LoopWatch.Analytics.Statistics;

/// <summary>
/// Streaming mean and variance by Welford's update (Welford 1962), with removal for sliding windows and Chan's
/// pairwise combination for merging per-bucket aggregates. Allocates nothing.
/// </summary>
public sealed class RunningMoments
{
    private long _n;
    private double _mean, _m2;

    /// <summary>Number of values taken.</summary>
    public long Count => _n;

    /// <summary>The moments so far.</summary>
    public Moments Value => Of(_n, _mean, _m2);

    /// <summary>Adds one value.</summary>
    public void Add(double x)
    {
        _n++;
        var d = x - _mean;
        _mean += d / _n;
        _m2 += d * (x - _mean);
    }

    /// <summary>Removes a value that was added before (the oldest of a sliding window).</summary>
    public void Remove(double x)
    {
        if (_n <= 1) { Clear(); return; }
        var d = x - _mean;
        _mean -= d / (_n - 1);
        _m2 -= d * (x - _mean);
        _n--;
        // Rounding can leave a tiny negative sum of squares after many removals.
        if (_m2 < 0) _m2 = 0;
    }

    /// <summary>Adds the values summarised by <paramref name="other"/> (Chan, Golub and LeVeque 1979).</summary>
    public void Add(in Moments other)
    {
        if (other.Count == 0) return;
        var m2 = other.Count > 1 ? other.Variance * (other.Count - 1) : 0;
        if (_n == 0) { _n = other.Count; _mean = other.Mean; _m2 = m2; return; }
        var n = _n + other.Count;
        var d = other.Mean - _mean;
        _mean += d * other.Count / n;
        _m2 += m2 + d * d * _n * other.Count / n;
        _n = n;
    }

    /// <summary>Forgets every value.</summary>
    public void Clear()
    {
        _n = 0;
        _mean = 0;
        _m2 = 0;
    }

    private static Moments Of(long n, double mean, double m2)
    {
        if (n == 0) return Moments.Empty;
        if (n == 1) return new Moments(1, mean, double.NaN, double.NaN);
        var v = m2 / (n - 1);
        return new Moments(n, mean, v, Math.Sqrt(v));
    }
}

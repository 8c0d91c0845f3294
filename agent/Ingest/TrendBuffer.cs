using LoopWatch.Dashboard.Model;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// The last hour of a loop for the trend chart: PV, SP and OP averaged into fixed buckets (5 s by default, 720 of them),
/// so a loop costs about 17 KB however fast it is sampled.
/// </summary>
public sealed class TrendBuffer
{
    private readonly long _bucketTicks;
    // One struct per bucket: a sample touches one cache line, not one in each of five arrays (10,000 loops do not fit in cache).
    private readonly Bucket[] _buckets;
    private long _currentSlot = -1;
    private long _currentEnd = long.MinValue;
    private int _current;

    /// <summary>A buffer of <paramref name="buckets"/> buckets of <paramref name="bucket"/> each.</summary>
    public TrendBuffer(TimeSpan bucket, int buckets = 720)
    {
        _bucketTicks = bucket.Ticks;
        _buckets = new Bucket[buckets];
        for (var i = 0; i < buckets; i++) _buckets[i].Slot = -1;
    }

    /// <summary>Span covered by the whole buffer.</summary>
    public TimeSpan Window => TimeSpan.FromTicks(_bucketTicks * _buckets.Length);

    /// <summary>Adds one aligned point (UTC ticks).</summary>
    public void Add(long ticks, double pv, double sp, double op)
    {
        // Most points fall in the bucket of the point before: no division then.
        if (ticks >= _currentEnd || ticks < _currentEnd - _bucketTicks)
        {
            var slot = ticks / _bucketTicks;
            var i = (int)(slot % _buckets.Length);
            ref var b = ref _buckets[i];
            if (b.Slot != slot)
            {
                if (b.Slot > slot) return;
                b = new Bucket { Slot = slot };
            }
            if (slot >= _currentSlot)
            {
                _currentSlot = slot;
                _currentEnd = (slot + 1) * _bucketTicks;
                _current = i;
            }
            b.Take(pv, sp, op);
            return;
        }
        _buckets[_current].Take(pv, sp, op);
    }

    /// <summary>The points from <paramref name="fromTicks"/> on, oldest first.</summary>
    public List<TrendPoint> Since(long fromTicks)
    {
        var list = new List<TrendPoint>(_buckets.Length);
        var first = fromTicks / _bucketTicks;
        foreach (var b in _buckets)
        {
            if (b.Slot < first || b.Slot < 0 || b.N == 0) continue;
            list.Add(new TrendPoint(b.Slot * _bucketTicks + _bucketTicks / 2, b.Pv / b.N, b.Sp / b.N, b.Op / b.N));
        }
        list.Sort((a, b) => a.Ticks.CompareTo(b.Ticks));
        return list;
    }

    private struct Bucket
    {
        public long Slot;
        public float Pv, Sp, Op;
        public int N;

        // Sums, divided when read: a 5 s bucket holds a handful of points, so float sums keep chart precision.
        public void Take(double pv, double sp, double op)
        {
            Pv += (float)pv;
            Sp += (float)sp;
            Op += (float)op;
            N++;
        }
    }
}

using LoopWatch.Dashboard.Model;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// The last hour of a loop for the trend chart: PV, SP and OP averaged into fixed buckets (5 s by default, 720 of them),
/// so a loop costs about 17 KB however fast it is sampled.
/// </summary>
public sealed class TrendBuffer
{
    private readonly long _bucketTicks;
    private readonly long[] _slot;
    private readonly float[] _pv, _sp, _op;
    private readonly int[] _n;

    /// <summary>A buffer of <paramref name="buckets"/> buckets of <paramref name="bucket"/> each.</summary>
    public TrendBuffer(TimeSpan bucket, int buckets = 720)
    {
        _bucketTicks = bucket.Ticks;
        _slot = new long[buckets];
        _pv = new float[buckets];
        _sp = new float[buckets];
        _op = new float[buckets];
        _n = new int[buckets];
        Array.Fill(_slot, -1);
    }

    /// <summary>Span covered by the whole buffer.</summary>
    public TimeSpan Window => TimeSpan.FromTicks(_bucketTicks * _slot.Length);

    /// <summary>Adds one aligned point (UTC ticks).</summary>
    public void Add(long ticks, double pv, double sp, double op)
    {
        var slot = ticks / _bucketTicks;
        var i = (int)(slot % _slot.Length);
        if (_slot[i] != slot)
        {
            if (_slot[i] > slot) return;
            _slot[i] = slot;
            _pv[i] = _sp[i] = _op[i] = 0;
            _n[i] = 0;
        }
        var n = ++_n[i];
        // Running means keep floats accurate without a sum that grows.
        _pv[i] += (float)((pv - _pv[i]) / n);
        _sp[i] += (float)((sp - _sp[i]) / n);
        _op[i] += (float)((op - _op[i]) / n);
    }

    /// <summary>The points from <paramref name="fromTicks"/> on, oldest first.</summary>
    public List<TrendPoint> Since(long fromTicks)
    {
        var list = new List<TrendPoint>(_slot.Length);
        var first = fromTicks / _bucketTicks;
        for (var i = 0; i < _slot.Length; i++)
        {
            if (_slot[i] < first || _slot[i] < 0) continue;
            list.Add(new TrendPoint(_slot[i] * _bucketTicks + _bucketTicks / 2, _pv[i], _sp[i], _op[i]));
        }
        list.Sort((a, b) => a.Ticks.CompareTo(b.Ticks));
        return list;
    }
}

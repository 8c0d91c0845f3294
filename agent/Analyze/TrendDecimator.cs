using LoopWatch.Dashboard.Model;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// A trend of a whole analysed span in a fixed number of buckets: when the buckets run out, neighbours are merged in
/// pairs and the bucket width doubles, so a loop costs the same memory for an hour or a year of data.
/// </summary>
public sealed class TrendDecimator
{
    private readonly double[] _pv, _sp, _op;
    private readonly int[] _n, _nSp;
    private long _origin = long.MinValue, _width;
    private int _used;

    /// <summary>A trend of at most <paramref name="buckets"/> points (even), starting at <paramref name="width"/> per bucket.</summary>
    public TrendDecimator(int buckets = 600, TimeSpan? width = null)
    {
        if (buckets < 2 || buckets % 2 != 0) throw new ArgumentOutOfRangeException(nameof(buckets), "an even count of at least 2");
        _width = (width ?? TimeSpan.FromSeconds(1)).Ticks;
        _pv = new double[buckets];
        _sp = new double[buckets];
        _op = new double[buckets];
        _n = new int[buckets];
        _nSp = new int[buckets];
    }

    /// <summary>Adds one aligned sample; samples come in time order.</summary>
    public void Add(long ticks, double pv, double sp, double op)
    {
        if (_origin == long.MinValue) _origin = ticks;
        var i = (ticks - _origin) / _width;
        if (i < 0) return;
        while (i >= _n.Length)
        {
            Halve();
            i = (ticks - _origin) / _width;
        }
        var b = (int)i;
        if (b >= _used) _used = b + 1;
        _n[b]++;
        _pv[b] += pv;
        _op[b] += op;
        if (double.IsFinite(sp)) { _sp[b] += sp; _nSp[b]++; }
    }

    /// <summary>The bucket means, oldest first; empty buckets are left out.</summary>
    public List<TrendPoint> Points()
    {
        var list = new List<TrendPoint>(_used);
        for (var i = 0; i < _used; i++)
        {
            if (_n[i] == 0) continue;
            list.Add(new TrendPoint(_origin + i * _width + _width / 2, (float)(_pv[i] / _n[i]),
                _nSp[i] == 0 ? float.NaN : (float)(_sp[i] / _nSp[i]), (float)(_op[i] / _n[i])));
        }
        return list;
    }

    private void Halve()
    {
        var half = _n.Length / 2;
        for (var i = 0; i < half; i++)
        {
            int a = 2 * i, b = a + 1;
            _n[i] = _n[a] + _n[b];
            _nSp[i] = _nSp[a] + _nSp[b];
            _pv[i] = _pv[a] + _pv[b];
            _sp[i] = _sp[a] + _sp[b];
            _op[i] = _op[a] + _op[b];
        }
        Array.Clear(_n, half, half);
        Array.Clear(_nSp, half, half);
        Array.Clear(_pv, half, half);
        Array.Clear(_sp, half, half);
        Array.Clear(_op, half, half);
        _used = (_used + 1) / 2;
        _width *= 2;
    }
}

namespace LoopWatch.Analytics.OnOff;

/// <summary>
/// Finds on-off cycles from output edges (off to on is a start; a cycle runs from one start to the next) and keeps the
/// last complete cycles in a preallocated ring. Starts per hour come from the mean period of the recent cycles rather
/// than a count over a rolling hour, which would step by whole starts; an open cycle that has already lasted longer
/// than that mean replaces the oldest recent cycle, so the figure falls as soon as cycling slows or stops.
/// </summary>
public sealed class CycleTracker
{
    private readonly OnOffCycle[] _ring;
    private int _head, _count;
    private long _completed;
    private bool _known, _on;
    private long _startTicks = long.MinValue, _stopTicks = long.MinValue;
    private double _pvMin = double.PositiveInfinity, _pvMax = double.NegativeInfinity;

    /// <summary>A tracker keeping <paramref name="history"/> complete cycles.</summary>
    public CycleTracker(int history = 32)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(history, 2);
        _ring = new OnOffCycle[history];
    }

    /// <summary>Complete cycles since the tracker was made.</summary>
    public long CompletedCycles => _completed;

    /// <summary>Starts seen (off-to-on edges).</summary>
    public long Starts { get; private set; }

    /// <summary>Complete cycles held, at most the history length.</summary>
    public int Held => _count;

    /// <summary>True while the element is on (as last seen).</summary>
    public bool On => _on;

    /// <summary>A held cycle: 0 is the newest.</summary>
    public OnOffCycle Cycle(int back)
    {
        if ((uint)back >= (uint)_count) throw new ArgumentOutOfRangeException(nameof(back));
        return _ring[(_head - 1 - back + _ring.Length * 2) % _ring.Length];
    }

    /// <summary>Takes one sample; returns true when it completes a cycle. <paramref name="pvPct"/> counts only when <paramref name="pvGood"/>.</summary>
    public bool Step(long ticks, bool on, double pvPct, bool pvGood)
    {
        var completed = false;
        if (!_known)
        {
            // The first sample tells the state, not when it began: no start is counted for it.
            _known = true;
            _on = on;
        }
        else if (on != _on)
        {
            _on = on;
            if (on)
            {
                Starts++;
                if (_startTicks != long.MinValue && _stopTicks != long.MinValue) completed = Close(ticks);
                _startTicks = ticks;
                _stopTicks = long.MinValue;
                _pvMin = double.PositiveInfinity;
                _pvMax = double.NegativeInfinity;
            }
            else if (_startTicks != long.MinValue) _stopTicks = ticks;
        }
        if (pvGood && _startTicks != long.MinValue)
        {
            if (pvPct < _pvMin) _pvMin = pvPct;
            if (pvPct > _pvMax) _pvMax = pvPct;
        }
        return completed;
    }

    /// <summary>Figures over the last <paramref name="recent"/> complete cycles as of <paramref name="nowTicks"/>.</summary>
    public CycleFigures Figures(long nowTicks, int recent)
    {
        var n = Math.Min(recent, _count);
        if (n == 0) return new CycleFigures(0, null, null, null, null, null, null);
        Sum(0, n, out var period, out var onTicks, out var amp, out var ampN, out var oldest);
        var meanPeriod = (double)period / n;
        var estimate = meanPeriod;
        if (_startTicks != long.MinValue)
        {
            var open = nowTicks - _startTicks;
            if (open > meanPeriod) estimate = (double)(period - oldest + open) / n;
        }
        var sph = 3600.0 * TimeSpan.TicksPerSecond / estimate;
        double? sphTrend = null, ampTrend = null;
        if (n == recent && _count >= 2 * n)
        {
            Sum(n, n, out var oPeriod, out _, out var oAmp, out var oAmpN, out _);
            sphTrend = 3600.0 * TimeSpan.TicksPerSecond * n / period - 3600.0 * TimeSpan.TicksPerSecond * n / oPeriod;
            if (ampN > 0 && oAmpN > 0) ampTrend = amp / ampN - oAmp / oAmpN;
        }
        return new CycleFigures(n, meanPeriod / TimeSpan.TicksPerSecond, sph, 100.0 * onTicks / period,
            ampN > 0 ? amp / ampN : null, sphTrend, ampTrend);
    }

    /// <summary>Forgets the open cycle (data gap); complete cycles are kept.</summary>
    public void Reset()
    {
        _known = false;
        _startTicks = long.MinValue;
        _stopTicks = long.MinValue;
        _pvMin = double.PositiveInfinity;
        _pvMax = double.NegativeInfinity;
    }

    private bool Close(long ticks)
    {
        var min = double.IsFinite(_pvMin) ? _pvMin : double.NaN;
        var max = double.IsFinite(_pvMax) ? _pvMax : double.NaN;
        _ring[_head] = new OnOffCycle(_startTicks, _stopTicks - _startTicks, ticks - _startTicks, min, max);
        _head = (_head + 1) % _ring.Length;
        if (_count < _ring.Length) _count++;
        _completed++;
        return true;
    }

    private void Sum(int skip, int n, out long period, out long onTicks, out double amp, out int ampN, out long oldest)
    {
        period = 0; onTicks = 0; amp = 0; ampN = 0; oldest = 0;
        for (var i = skip; i < skip + n; i++)
        {
            var c = _ring[(_head - 1 - i + _ring.Length * 2) % _ring.Length];
            period += c.PeriodTicks;
            onTicks += c.OnTicks;
            oldest = c.PeriodTicks;
            if (!double.IsNaN(c.PvMinPct)) { amp += c.AmplitudePct; ampN++; }
        }
    }
}

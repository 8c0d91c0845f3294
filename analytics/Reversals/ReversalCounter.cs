namespace LoopWatch.Analytics.Reversals;

/// <summary>
/// Reversals and travel of one final element. A deadband turning-point filter: a move against the current direction
/// of more than the deadband from the last extreme is a reversal, and travel is the path length of the filtered signal
/// (every move once it is beyond the deadband), in % of stroke. Confirmed turning points feed a <see cref="RainflowCounter"/>.
/// Rates come from a ring of one-minute buckets over a rolling window.
/// </summary>
public sealed class ReversalCounter
{
    private readonly double _deadband;
    private readonly long[] _bucketMinute;
    private readonly int[] _bucketReversals;
    private readonly double[] _bucketTravel;
    private bool _started;
    private int _direction;
    private double _anchor, _extreme;
    private long _reversals, _sinceTicks, _windowStartTicks = long.MinValue, _lastTicks;
    private double _travel;
    private long _minuteStart = long.MaxValue, _minuteEnd = long.MinValue;
    private int _slot;

    /// <summary>A counter with a deadband in % of stroke and a rate window of <paramref name="windowMinutes"/> one-minute buckets.</summary>
    public ReversalCounter(double deadbandPct, int windowMinutes = 60, int residueCapacity = 64)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(deadbandPct);
        ArgumentOutOfRangeException.ThrowIfLessThan(windowMinutes, 1);
        _deadband = deadbandPct;
        _bucketMinute = new long[windowMinutes];
        Array.Fill(_bucketMinute, long.MinValue);
        _bucketReversals = new int[windowMinutes];
        _bucketTravel = new double[windowMinutes];
        Rainflow = new RainflowCounter(residueCapacity);
    }

    /// <summary>Rainflow count of the move ranges.</summary>
    public RainflowCounter Rainflow { get; }

    /// <summary>Samples taken.</summary>
    public long Samples { get; private set; }

    /// <summary>The lifetime counters (seeded ones included).</summary>
    public ElementCounters Counters => new(_reversals, _travel, _sinceTicks);

    /// <summary>Current direction of the filtered signal: +1 rising, -1 falling, 0 not yet moved beyond the deadband.</summary>
    public int Direction => _direction;

    /// <summary>Restores lifetime counters saved by storage; call before the first sample.</summary>
    public void Seed(in ElementCounters counters)
    {
        _reversals = counters.Reversals;
        _travel = counters.TravelPct;
        _sinceTicks = counters.SinceTicks;
    }

    /// <summary>Takes one value (% of stroke) at event time <paramref name="ticks"/>; returns true when it confirms a reversal.</summary>
    public bool Step(long ticks, double valuePct)
    {
        if (double.IsNaN(valuePct)) return false;
        Samples++;
        _lastTicks = ticks;
        if (_sinceTicks == 0) _sinceTicks = ticks;
        if (_windowStartTicks == long.MinValue) _windowStartTicks = ticks;
        var slot = Slot(ticks);
        if (!_started)
        {
            _started = true;
            _anchor = _extreme = valuePct;
            return false;
        }
        var reversed = false;
        double moved = 0;
        if (_direction == 0)
        {
            if (Math.Abs(valuePct - _anchor) > _deadband)
            {
                _direction = valuePct > _anchor ? 1 : -1;
                Rainflow.Add(_anchor);
                moved = Math.Abs(valuePct - _anchor);
                _extreme = valuePct;
            }
        }
        else if ((valuePct - _extreme) * _direction > 0)
        {
            moved = Math.Abs(valuePct - _extreme);
            _extreme = valuePct;
        }
        else if (Math.Abs(valuePct - _extreme) > _deadband)
        {
            Rainflow.Add(_extreme);
            moved = Math.Abs(valuePct - _extreme);
            _direction = -_direction;
            _extreme = valuePct;
            _reversals++;
            _bucketReversals[slot]++;
            reversed = true;
        }
        if (moved > 0)
        {
            _travel += moved;
            _bucketTravel[slot] += moved;
        }
        return reversed;
    }

    /// <summary>Seconds of data the rate window covers now (up to its length).</summary>
    public double WindowSeconds
    {
        get
        {
            if (_windowStartTicks == long.MinValue) return 0;
            var oldest = (_lastTicks / TimeSpan.TicksPerMinute - (_bucketMinute.Length - 1)) * TimeSpan.TicksPerMinute;
            return (double)(_lastTicks - Math.Max(oldest, _windowStartTicks)) / TimeSpan.TicksPerSecond;
        }
    }

    /// <summary>Reversals per hour over the rate window; null before any time has passed.</summary>
    public double? ReversalsPerHour => Rate(out var reversals, out _) is { } s ? reversals * 3600.0 / s : null;

    /// <summary>Travel in % of stroke per hour over the rate window; null before any time has passed.</summary>
    public double? TravelPctPerHour => Rate(out _, out var travel) is { } s ? travel * 3600.0 / s : null;

    /// <summary>Restarts the rate window (after a data gap); lifetime counters, filter and rainflow state are kept.</summary>
    public void RestartWindow()
    {
        Array.Fill(_bucketMinute, long.MinValue);
        Array.Clear(_bucketReversals);
        Array.Clear(_bucketTravel);
        _windowStartTicks = long.MinValue;
        _minuteStart = long.MaxValue;
        _minuteEnd = long.MinValue;
    }

    private double? Rate(out long reversals, out double travel)
    {
        reversals = 0;
        travel = 0;
        var seconds = WindowSeconds;
        if (seconds <= 0) return null;
        var current = _lastTicks / TimeSpan.TicksPerMinute;
        for (var i = 0; i < _bucketMinute.Length; i++)
        {
            if (_bucketMinute[i] <= current - _bucketMinute.Length) continue;
            reversals += _bucketReversals[i];
            travel += _bucketTravel[i];
        }
        return seconds;
    }

    private int Slot(long ticks)
    {
        // Divisions only once a minute: most samples fall in the bucket of the one before.
        if (ticks >= _minuteStart && ticks < _minuteEnd) return _slot;
        var minute = ticks / TimeSpan.TicksPerMinute;
        var slot = (int)(minute % _bucketMinute.Length);
        if (_bucketMinute[slot] != minute)
        {
            _bucketMinute[slot] = minute;
            _bucketReversals[slot] = 0;
            _bucketTravel[slot] = 0;
        }
        _minuteStart = minute * TimeSpan.TicksPerMinute;
        _minuteEnd = _minuteStart + TimeSpan.TicksPerMinute;
        _slot = slot;
        return slot;
    }
}

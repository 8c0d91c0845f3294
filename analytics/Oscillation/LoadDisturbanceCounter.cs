namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// Hagglund's load-disturbance detector (Control Engineering Practice 3(11), 1995): the IAE of the control error between
/// consecutive zero crossings is compared with IAE_lim = 2a/w_u, and detections are counted with exponential forgetting
/// x = gamma x + l, gamma = 1 - dt/T_sup, T_sup = supervision periods * T_u, evaluated at each zero crossing (dt = time since the last one).
/// </summary>
public sealed class LoadDisturbanceCounter
{
    private readonly double _amplitudePct;
    private readonly double _supervisionPeriods;
    private long _lastTicks;
    private double _lastError;
    private bool _started;
    private double _iae;
    private long _lastCrossingTicks;
    private bool _crossedOnce;
    private double _lastUltimateS = 1;

    /// <summary>A counter with limit amplitude <paramref name="amplitudePct"/> (Hagglund's a) and T_sup = <paramref name="supervisionPeriods"/> T_u.</summary>
    public LoadDisturbanceCounter(double amplitudePct, double supervisionPeriods)
    {
        _amplitudePct = amplitudePct;
        _supervisionPeriods = supervisionPeriods;
    }

    /// <summary>The forgetting count x as of the last zero crossing.</summary>
    public double Count { get; private set; }

    /// <summary>IAE (% s) of the last completed half period between zero crossings.</summary>
    public double LastIae { get; private set; }

    /// <summary>True when the last completed half period was a load disturbance.</summary>
    public bool LastWasLoad { get; private set; }

    /// <summary>Load disturbances detected since the last reset.</summary>
    public long Loads { get; private set; }

    /// <summary>Event time of the last zero crossing (interpolated), UTC ticks; 0 before any.</summary>
    public long LastCrossingTicks => _lastCrossingTicks;

    /// <summary>Smoothed length of the half periods that were load disturbances, seconds; NaN before any.</summary>
    public double HalfPeriodS { get; private set; } = double.NaN;

    /// <summary>The IAE limit 2a/w_u = a T_u / pi for an ultimate period of <paramref name="ultimatePeriodS"/> s.</summary>
    public double IaeLimit(double ultimatePeriodS) => _amplitudePct * ultimatePeriodS / Math.PI;

    /// <summary>
    /// Takes the control error (% of span) at <paramref name="ticks"/>; returns true when a zero crossing completed a half period here.
    /// The error is integrated by trapezoids split at the interpolated crossing.
    /// </summary>
    public bool Step(long ticks, double errorPct, double ultimatePeriodS)
    {
        if (!_started || ticks <= _lastTicks)
        {
            _started = true;
            _lastTicks = ticks;
            _lastError = errorPct;
            return false;
        }
        var dt = (ticks - _lastTicks) / (double)TimeSpan.TicksPerSecond;
        var prev = _lastError;
        _lastTicks = ticks;
        // An exact zero keeps the previous sign, so touching zero is not a crossing.
        if (errorPct == 0 || prev == 0 || Math.Sign(errorPct) == Math.Sign(prev))
        {
            _iae += 0.5 * (Math.Abs(errorPct) + Math.Abs(prev)) * dt;
            if (errorPct != 0) _lastError = errorPct;
            return false;
        }
        var f = prev / (prev - errorPct);
        _iae += 0.5 * Math.Abs(prev) * f * dt;
        var crossing = ticks - (long)((1 - f) * dt * TimeSpan.TicksPerSecond);
        var completed = _crossedOnce;
        if (completed) Cross(crossing, ultimatePeriodS);
        _crossedOnce = true;
        _lastCrossingTicks = crossing;
        _iae = 0.5 * Math.Abs(errorPct) * (1 - f) * dt;
        _lastError = errorPct;
        return completed;
    }

    /// <summary>The count x forgotten up to <paramref name="ticks"/> as if a crossing without load happened then.</summary>
    public double CountAt(long ticks)
    {
        if (!_crossedOnce) return 0;
        return Count * Gamma(ticks - _lastCrossingTicks, _lastUltimateS);
    }

    /// <summary>Forgets everything (mode change, data gap).</summary>
    public void Reset()
    {
        _started = false;
        _crossedOnce = false;
        _iae = 0;
        Count = 0;
        LastIae = 0;
        LastWasLoad = false;
        HalfPeriodS = double.NaN;
    }

    /// <summary>Clears the count only, as after an oscillation finding ended.</summary>
    public void ClearCount() => Count = 0;

    private void Cross(long crossing, double ultimatePeriodS)
    {
        _lastUltimateS = ultimatePeriodS;
        LastIae = _iae;
        LastWasLoad = _iae > IaeLimit(ultimatePeriodS);
        Count = Count * Gamma(crossing - _lastCrossingTicks, ultimatePeriodS) + (LastWasLoad ? 1 : 0);
        if (!LastWasLoad) return;
        Loads++;
        var half = (crossing - _lastCrossingTicks) / (double)TimeSpan.TicksPerSecond;
        HalfPeriodS = double.IsNaN(HalfPeriodS) ? half : 0.8 * HalfPeriodS + 0.2 * half;
    }

    private double Gamma(long elapsedTicks, double ultimatePeriodS)
    {
        var tSup = _supervisionPeriods * ultimatePeriodS;
        return Math.Max(0, 1 - elapsedTicks / (double)TimeSpan.TicksPerSecond / tSup);
    }
}

namespace LoopWatch.Analytics.DeadZone;

/// <summary>Running sums for the least-squares slope of y over t; allocation-free, one per half cycle.</summary>
public struct SlopeSums
{
    private double _t, _y, _tt, _ty;

    /// <summary>Points taken.</summary>
    public int Count { get; private set; }

    /// <summary>Adds one point; keep <paramref name="t"/> small (time since the half cycle began) for accuracy.</summary>
    public void Add(double t, double y)
    {
        Count++;
        _t += t;
        _y += y;
        _tt += t * t;
        _ty += t * y;
    }

    /// <summary>The fitted line's value at <paramref name="t"/>; NaN when there is no slope.</summary>
    public readonly double ValueAt(double t) => double.IsFinite(Slope) ? (_y - Slope * _t) / Count + Slope * t : double.NaN;

    /// <summary>The least-squares slope dy/dt; NaN below three points or when t does not vary.</summary>
    public readonly double Slope
    {
        get
        {
            if (Count < 3) return double.NaN;
            var d = Count * _tt - _t * _t;
            return d > 0 ? (Count * _ty - _t * _y) / d : double.NaN;
        }
    }
}

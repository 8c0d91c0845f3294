namespace LoopWatch.Analytics.Statistics;

/// <summary>Mean and variance of the last <see cref="Capacity"/> values, kept in a preallocated ring; allocates nothing per value.</summary>
public sealed class WindowedMoments
{
    private readonly double[] _ring;
    private readonly RunningMoments _moments = new();
    private int _head, _count;

    /// <summary>A window of <paramref name="capacity"/> values.</summary>
    public WindowedMoments(int capacity)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 1);
        _ring = new double[capacity];
    }

    /// <summary>How many values the window holds when full.</summary>
    public int Capacity => _ring.Length;

    /// <summary>The moments of the values in the window.</summary>
    public Moments Value => _moments.Value;

    /// <summary>Adds a value, dropping the oldest once the window is full.</summary>
    public void Add(double x)
    {
        if (_count == _ring.Length) _moments.Remove(_ring[_head]);
        else _count++;
        _ring[_head] = x;
        _head = (_head + 1) % _ring.Length;
        _moments.Add(x);
        // Add/remove pairs drift slowly; a fresh sum once per window length keeps it exact at O(1) amortised.
        if (_head == 0 && _count == _ring.Length) Recompute();
    }

    private void Recompute()
    {
        _moments.Clear();
        foreach (var v in _ring) _moments.Add(v);
    }

    /// <summary>Empties the window.</summary>
    public void Clear()
    {
        _moments.Clear();
        _head = 0;
        _count = 0;
    }
}

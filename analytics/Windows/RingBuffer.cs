namespace LoopWatch.Analytics.Windows;

/// <summary>
/// The latest <see cref="Capacity"/> values of one signal, oldest overwritten first. Values are kept as float:
/// % of span needs no more than 7 digits, and it halves a loop's state.
/// </summary>
public sealed class RingBuffer
{
    private readonly float[] _items;
    private int _next;

    /// <summary>An empty buffer holding at most <paramref name="capacity"/> values.</summary>
    public RingBuffer(int capacity)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 1);
        _items = new float[capacity];
    }

    /// <summary>How many values the buffer can hold.</summary>
    public int Capacity => _items.Length;

    /// <summary>How many values it holds now.</summary>
    public int Count { get; private set; }

    /// <summary>Appends a value, dropping the oldest when full.</summary>
    public void Add(double value)
    {
        _items[_next] = (float)value;
        _next = _next + 1 == _items.Length ? 0 : _next + 1;
        if (Count < _items.Length) Count++;
    }

    /// <summary>The value <paramref name="age"/> places back from the newest (0 = newest).</summary>
    public double this[int age]
    {
        get
        {
            if ((uint)age >= (uint)Count) throw new ArgumentOutOfRangeException(nameof(age));
            var i = _next - 1 - age;
            return _items[i < 0 ? i + _items.Length : i];
        }
    }

    /// <summary>Forgets every value.</summary>
    public void Clear()
    {
        Count = 0;
        _next = 0;
    }

    /// <summary>Copies the held values oldest first into <paramref name="destination"/>; returns how many were copied.</summary>
    public int CopyTo(Span<float> destination)
    {
        if (destination.Length < Count) throw new ArgumentException("destination is shorter than Count", nameof(destination));
        var start = _next - Count;
        if (start >= 0)
        {
            _items.AsSpan(start, Count).CopyTo(destination);
        }
        else
        {
            var tail = -start;
            _items.AsSpan(_items.Length - tail, tail).CopyTo(destination);
            _items.AsSpan(0, _next).CopyTo(destination[tail..]);
        }
        return Count;
    }

    /// <summary>Mean of the held values; NaN when empty.</summary>
    public double Mean()
    {
        if (Count == 0) return double.NaN;
        double sum = 0;
        for (var i = 0; i < Count; i++) sum += this[i];
        return sum / Count;
    }

    /// <summary>Sample standard deviation (n - 1) of the held values, two-pass; NaN below two values.</summary>
    public double StandardDeviation()
    {
        if (Count < 2) return double.NaN;
        var mean = Mean();
        double sum = 0;
        for (var i = 0; i < Count; i++)
        {
            var d = this[i] - mean;
            sum += d * d;
        }
        return Math.Sqrt(sum / (Count - 1));
    }

    /// <summary>Half of max - min of the newest <paramref name="count"/> values (fewer when fewer are held); NaN when empty.</summary>
    public double HalfRange(int count)
    {
        count = Math.Min(count, Count);
        if (count <= 0) return double.NaN;
        double min = double.PositiveInfinity, max = double.NegativeInfinity;
        for (var i = 0; i < count; i++)
        {
            var v = this[i];
            if (v < min) min = v;
            if (v > max) max = v;
        }
        return (max - min) / 2;
    }
}

namespace LoopWatch.Analytics.Reversals;

/// <summary>
/// Streaming rainflow count of move ranges after ASTM E1049-85 (reapproved 2017), 5.4.4, three-point method, fed with
/// alternating turning points. Closed cycles (and the half cycles of 5.4.4 step 5) go straight into a fixed histogram;
/// the residue left on the stack counts as half cycles (step 6) whenever the histogram is read. Bins by range in % of
/// stroke: 0-0.5, 0.5-1, 1-2, 2-5, 5-10, 10-20, 20-50, 50-100 (100 % and above in the last); lower edge inclusive.
/// </summary>
public sealed class RainflowCounter
{
    /// <summary>Bin edges in % of stroke; bin i spans edge i (inclusive) to edge i + 1.</summary>
    public static IReadOnlyList<double> BinEdgesPct { get; } = [0, 0.5, 1, 2, 5, 10, 20, 50, 100];

    /// <summary>Number of histogram bins.</summary>
    public const int BinCount = 8;

    private readonly double[] _stack;
    private readonly double[] _closed = new double[BinCount];
    private readonly Action<double, double>? _exact;
    private int _n;

    /// <summary>
    /// A counter whose residue holds at most <paramref name="residueCapacity"/> points (when full, the oldest range is
    /// counted as a half cycle, as the end of a record would); <paramref name="exact"/> hears every closed range and its count.
    /// </summary>
    public RainflowCounter(int residueCapacity = 64, Action<double, double>? exact = null)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(residueCapacity, 3);
        _stack = new double[residueCapacity];
        _exact = exact;
    }

    /// <summary>Cycles closed so far, half cycles of step 5 counting 0.5; residue not included.</summary>
    public double ClosedCycles { get; private set; }

    /// <summary>The turning points not yet closed, oldest first (the first is the starting point S).</summary>
    public ReadOnlySpan<double> Residue => _stack.AsSpan(0, _n);

    /// <summary>The histogram bin of a range in % of stroke.</summary>
    public static int BinOf(double range)
    {
        var edges = BinEdgesPct;
        for (var i = BinCount - 1; i > 0; i--) if (range >= edges[i]) return i;
        return 0;
    }

    /// <summary>Takes the next turning point; a point that does not reverse the direction extends the last one instead.</summary>
    public void Add(double point)
    {
        if (_n >= 1 && point == _stack[_n - 1]) return;
        if (_n >= 2 && Math.Sign(point - _stack[_n - 1]) == Math.Sign(_stack[_n - 1] - _stack[_n - 2]))
        {
            _stack[_n - 1] = point;
        }
        else
        {
            if (_n == _stack.Length) DropOldest();
            _stack[_n++] = point;
        }
        Close();
    }

    /// <summary>Copies the counts per bin into <paramref name="counts"/> (length <see cref="BinCount"/>), with the residue as half cycles when asked.</summary>
    public void CopyHistogram(Span<double> counts, bool includeResidue = true)
    {
        if (counts.Length < BinCount) throw new ArgumentException($"needs {BinCount} bins", nameof(counts));
        _closed.AsSpan().CopyTo(counts);
        if (!includeResidue) return;
        for (var i = 1; i < _n; i++) counts[BinOf(Math.Abs(_stack[i] - _stack[i - 1]))] += 0.5;
    }

    /// <summary>The counts per bin as a new array (for the dashboard and storage; allocates).</summary>
    public double[] Histogram(bool includeResidue = true)
    {
        var counts = new double[BinCount];
        CopyHistogram(counts, includeResidue);
        return counts;
    }

    /// <summary>Restores closed counts and residue saved from <see cref="Histogram"/>(false) and <see cref="Residue"/>.</summary>
    public void Seed(ReadOnlySpan<double> closedCounts, ReadOnlySpan<double> residue)
    {
        if (closedCounts.Length != BinCount) throw new ArgumentException($"needs {BinCount} bins", nameof(closedCounts));
        closedCounts.CopyTo(_closed);
        var total = 0.0;
        foreach (var c in closedCounts) total += c;
        ClosedCycles = total;
        _n = 0;
        foreach (var p in residue) Add(p);
    }

    /// <summary>Rainflow count of a whole record of turning points: every range with its count, residue included (exact ranges).</summary>
    public static IReadOnlyList<(double Range, double Cycles)> CountRecord(ReadOnlySpan<double> points)
    {
        var found = new List<(double, double)>();
        var counter = new RainflowCounter(Math.Max(3, points.Length + 1), (r, c) => found.Add((r, c)));
        foreach (var p in points) counter.Add(p);
        var residue = counter.Residue;
        for (var i = 1; i < residue.Length; i++) found.Add((Math.Abs(residue[i] - residue[i - 1]), 0.5));
        return found;
    }

    private void Close()
    {
        // 5.4.4 steps 2-5: X is the newest range, Y the one before it.
        while (_n >= 3)
        {
            var x = Math.Abs(_stack[_n - 1] - _stack[_n - 2]);
            var y = Math.Abs(_stack[_n - 2] - _stack[_n - 3]);
            if (x < y) return;
            if (_n == 3)
            {
                // Y contains the starting point: a half cycle, and S moves to Y's second point.
                Count(y, 0.5);
                _stack[0] = _stack[1];
                _stack[1] = _stack[2];
                _n = 2;
            }
            else
            {
                Count(y, 1.0);
                _stack[_n - 3] = _stack[_n - 1];
                _n -= 2;
            }
        }
    }

    private void DropOldest()
    {
        Count(Math.Abs(_stack[1] - _stack[0]), 0.5);
        Array.Copy(_stack, 1, _stack, 0, _n - 1);
        _n--;
    }

    private void Count(double range, double cycles)
    {
        _closed[BinOf(range)] += cycles;
        ClosedCycles += cycles;
        _exact?.Invoke(range, cycles);
    }
}

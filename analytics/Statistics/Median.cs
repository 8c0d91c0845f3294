namespace LoopWatch.Analytics.Statistics;

/// <summary>The median of a few values, sorted in a caller's scratch span so nothing is allocated.</summary>
public static class Median
{
    /// <summary>The median of <paramref name="values"/> (mean of the middle two for an even count); NaN when empty.</summary>
    public static double Of(ReadOnlySpan<double> values, Span<double> scratch)
    {
        var n = values.Length;
        if (n == 0) return double.NaN;
        var s = scratch[..n];
        values.CopyTo(s);
        s.Sort();
        return n % 2 == 1 ? s[n / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
    }
}

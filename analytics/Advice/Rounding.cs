using System.Globalization;

namespace LoopWatch.Analytics.Advice;

/// <summary>Figures of advice rounded to significant digits, so what a page prints is what the next step computes from.</summary>
public static class Rounding
{
    /// <summary><paramref name="x"/> to <paramref name="digits"/> significant digits (4 by default).</summary>
    public static double Significant(double x, int digits = 4)
    {
        if (x == 0 || !double.IsFinite(x)) return x;
        var decimals = digits - 1 - (int)Math.Floor(Math.Log10(Math.Abs(x)));
        return decimals >= 0 ? Math.Round(x, Math.Min(decimals, 15)) : Math.Round(x / Math.Pow(10, -decimals)) * Math.Pow(10, -decimals);
    }

    /// <summary>A rounded figure as text, invariant culture, no trailing zeros.</summary>
    public static string Text(double x) => x.ToString("0.######", CultureInfo.InvariantCulture);
}

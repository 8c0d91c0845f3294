using System.Numerics;
using System.Runtime.InteropServices;

namespace LoopWatch.Analytics.Windows;

/// <summary>
/// Auto- and cross-correlation of windows by direct lag products (vectorised), for the few lags a detector needs;
/// inputs are expected mean-removed (see <see cref="Center{T}"/>). Biased estimator: every lag is divided by the same energy.
/// </summary>
public static class LagCorrelation
{
    /// <summary>Sum of a[i] * b[i] over the shorter length.</summary>
    public static T Dot<T>(ReadOnlySpan<T> a, ReadOnlySpan<T> b) where T : unmanaged, INumber<T>
    {
        var n = Math.Min(a.Length, b.Length);
        var sum = T.Zero;
        var i = 0;
        if (Vector.IsHardwareAccelerated && Vector<T>.IsSupported && n >= 2 * Vector<T>.Count)
        {
            var va = MemoryMarshal.Cast<T, Vector<T>>(a[..n]);
            var vb = MemoryMarshal.Cast<T, Vector<T>>(b[..n]);
            Vector<T> acc0 = Vector<T>.Zero, acc1 = Vector<T>.Zero;
            var v = 0;
            // Two accumulators let consecutive multiply-adds overlap in the pipeline.
            for (; v + 1 < va.Length; v += 2)
            {
                acc0 += va[v] * vb[v];
                acc1 += va[v + 1] * vb[v + 1];
            }
            if (v < va.Length) acc0 += va[v] * vb[v];
            sum = Vector.Sum(acc0 + acc1);
            i = va.Length * Vector<T>.Count;
        }
        for (; i < n; i++) sum += a[i] * b[i];
        return sum;
    }

    /// <summary>Subtracts the mean from every value in place; returns the mean (computed in double).</summary>
    public static double Center<T>(Span<T> x) where T : unmanaged, IFloatingPoint<T>
    {
        if (x.Length == 0) return 0;
        double sum = 0;
        foreach (var v in x) sum += double.CreateTruncating(v);
        var mean = sum / x.Length;
        var m = T.CreateTruncating(mean);
        for (var i = 0; i < x.Length; i++) x[i] -= m;
        return mean;
    }

    /// <summary>
    /// Autocorrelation r_k = sum x_t x_(t+k) / sum x_t^2 of a mean-removed window at lags 0 .. result.Length - 1;
    /// all zeros when the window has no energy.
    /// </summary>
    public static void Auto<T>(ReadOnlySpan<T> centered, Span<T> result) where T : unmanaged, INumber<T>
    {
        if (result.Length > centered.Length) throw new ArgumentException("more lags than samples", nameof(result));
        var energy = Dot(centered, centered);
        for (var k = 0; k < result.Length; k++)
            result[k] = energy == T.Zero ? T.Zero : Dot(centered[..^k], centered[k..]) / energy;
    }

    /// <summary>
    /// One lag of the cross-correlation, sum u_t y_(t+lag) (lag may be negative), of two mean-removed windows of equal length,
    /// not normalised; divide by sqrt(sum u^2 * sum y^2) for the coefficient.
    /// </summary>
    public static T Cross<T>(ReadOnlySpan<T> u, ReadOnlySpan<T> y, int lag) where T : unmanaged, INumber<T>
    {
        var n = Math.Min(u.Length, y.Length);
        var k = Math.Abs(lag);
        if (k >= n) return T.Zero;
        return lag >= 0 ? Dot(u[..(n - k)], y[k..n]) : Dot(u[k..n], y[..(n - k)]);
    }
}

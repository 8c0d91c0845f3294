using LoopWatch.Analytics.Windows;

namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// The regularity test of Thornhill, Huang and Zhang ("Detection of multiple oscillations in control loops",
/// Journal of Process Control 13, 2003): zero crossings of the ACF, periods T_p,i as the intervals between alternate
/// crossings, and r = (1/3) mean(T_p) / std(T_p); r > 1 means a regular oscillation.
/// </summary>
public static class AcfRegularity
{
    /// <summary>Largest regularity reported: a noise-free sinusoid has a std near zero and r would run off to infinity.</summary>
    public const double MaxRegularity = 100;

    /// <summary>
    /// Measures a mean-removed window up to <paramref name="maxLag"/>, stopping after <paramref name="crossings"/>.Length ACF
    /// zero crossings (their interpolated lags are left there); needs at least 5 crossings, i.e. 3 periods T_p,i.
    /// </summary>
    public static AcfPeriod Measure(ReadOnlySpan<float> centered, int maxLag, Span<double> crossings)
    {
        var n = centered.Length;
        maxLag = Math.Min(maxLag, n - 1);
        var energy = LagCorrelation.Dot(centered, centered);
        if (!(energy > 0) || crossings.Length < 5) return AcfPeriod.None;
        var found = 0;
        double prev = 1, peak = double.NaN;
        for (var k = 1; k <= maxLag && found < crossings.Length; k++)
        {
            var r = LagCorrelation.Dot(centered[..(n - k)], centered[k..]) / energy;
            if ((prev > 0 && r <= 0) || (prev < 0 && r >= 0))
            {
                // Linear interpolation between the lags: at 60 samples a period, whole lags alone would cost ~2 % of period.
                crossings[found++] = k - 1 + prev / (prev - r);
            }
            // The first positive lobe after two crossings is the peak at about one period.
            if (found == 2 && !(r <= peak)) peak = r;
            prev = r;
        }
        if (found < 5) return new AcfPeriod(double.NaN, double.NaN, peak, found);
        var count = found - 2;
        double sum = 0;
        for (var i = 0; i < count; i++) sum += crossings[i + 2] - crossings[i];
        var mean = sum / count;
        double ss = 0;
        for (var i = 0; i < count; i++)
        {
            var d = crossings[i + 2] - crossings[i] - mean;
            ss += d * d;
        }
        var std = Math.Sqrt(ss / (count - 1));
        var regularity = std > 0 ? Math.Min(MaxRegularity, mean / (3 * std)) : MaxRegularity;
        return new AcfPeriod(mean, regularity, peak, found);
    }
}

using LoopWatch.Analytics.Windows;

namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// Horch's cross-correlation test ("A simple method for detection of stiction in control valves", Control Engineering
/// Practice 7, 1999): for a self-regulating process, the cross-correlation of controller output and process value is an
/// odd function of lag when a sticking valve drives the oscillation and an even one when tuning or a disturbance does.
/// </summary>
public static class StictionCorrelation
{
    /// <summary>
    /// The phase of the cross-correlation at lag 0 in degrees, 0 = even, 90 = odd: with t_l, t_r the zero crossings nearest
    /// lag 0 on either side, phi = 90 (t_r + t_l) / (t_r - t_l), exact for a sinusoidal CCF cos(w(t - t0)).
    /// NaN when no crossing lies within <paramref name="maxLag"/> on one side.
    /// </summary>
    public static double PhaseDegrees(ReadOnlySpan<float> opCentered, ReadOnlySpan<float> pvCentered, int maxLag)
    {
        var c0 = (double)LagCorrelation.Cross(opCentered, pvCentered, 0);
        if (c0 == 0) return 90;
        var right = Crossing(opCentered, pvCentered, c0, maxLag, +1);
        var left = Crossing(opCentered, pvCentered, c0, maxLag, -1);
        if (double.IsNaN(right) || double.IsNaN(left) || right <= left) return double.NaN;
        return 90 * Math.Abs(right + left) / (right - left);
    }

    /// <summary>
    /// Classifies a phase: at least <paramref name="oddDegrees"/> is stiction, at most <paramref name="evenDegrees"/> is
    /// tuning or disturbance, between or NaN is unknown.
    /// </summary>
    public static string Classify(double phaseDegrees, double oddDegrees, double evenDegrees)
    {
        if (double.IsNaN(phaseDegrees)) return CauseHints.Unknown;
        if (phaseDegrees >= oddDegrees) return CauseHints.Stiction;
        if (phaseDegrees <= evenDegrees) return CauseHints.TuningOrDisturbance;
        return CauseHints.Unknown;
    }

    private static double Crossing(ReadOnlySpan<float> u, ReadOnlySpan<float> y, double c0, int maxLag, int direction)
    {
        var prev = c0;
        for (var k = 1; k <= maxLag; k++)
        {
            var c = (double)LagCorrelation.Cross(u, y, direction * k);
            if ((prev > 0 && c <= 0) || (prev < 0 && c >= 0))
                return direction * (k - 1 + prev / (prev - c));
            prev = c;
        }
        return double.NaN;
    }
}

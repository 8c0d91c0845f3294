using FsCheck.Xunit;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Reversals;

public sealed class ReversalPropertyTests
{
    /// <summary>An output path in quarter-% steps (exact in binary, so shifted runs compare bit for bit).</summary>
    private static double[] Path(int[]? steps, int startQuarters)
    {
        steps ??= [];
        var xs = new double[steps.Length];
        var q = startQuarters;
        for (var i = 0; i < steps.Length; i++)
        {
            q += steps[i] % 40;
            xs[i] = q / 4.0;
        }
        return xs;
    }

    private static ReversalCounter Count(double[] xs, double deadband)
    {
        var c = new ReversalCounter(deadband);
        for (var i = 0; i < xs.Length; i++) c.Step(LoopRig.At(i), xs[i]);
        return c;
    }

    [Property]
    public bool CountsAreNeverNegative_AndReversalsNeverExceedSamples(int[] steps, byte deadbandQuarters)
    {
        var c = Count(Path(steps, 200), deadbandQuarters % 8 / 4.0);
        var h = c.Rainflow.Histogram();
        return c.Counters.Reversals >= 0 && c.Counters.TravelPct >= 0 && c.Counters.Reversals <= c.Samples
            && h.All(x => x >= 0) && c.ReversalsPerHour is null or >= 0 && c.TravelPctPerHour is null or >= 0;
    }

    [Property]
    public bool ShiftedOutput_GivesTheSameCountsTravelAndHistogram(int[] steps, short shiftQuarters, byte deadbandQuarters)
    {
        var deadband = deadbandQuarters % 8 / 4.0;
        var a = Count(Path(steps, 200), deadband);
        var b = Count(Path(steps, 200 + shiftQuarters), deadband);
        return a.Counters == b.Counters && a.Rainflow.Histogram().SequenceEqual(b.Rainflow.Histogram());
    }

    [Property]
    public bool Rainflow_CountsEveryRangeOnceAsAHalf_OrPairedIntoAFullCycle(int[] points)
    {
        // ASTM E1049-85 5.4.4: a full cycle takes two ranges off the record and a half cycle one, so the counts
        // (residue included) add up to half the number of ranges between alternating turning points.
        var rf = new RainflowCounter(residueCapacity: 8);
        var turning = new List<double>();
        foreach (var p in points ?? [])
        {
            double x = p % 1000;
            if (turning.Count > 0 && x == turning[^1]) continue;
            if (turning.Count > 1 && Math.Sign(x - turning[^1]) == Math.Sign(turning[^1] - turning[^2])) turning[^1] = x;
            else turning.Add(x);
        }
        foreach (var x in turning) rf.Add(x);
        var total = rf.Histogram().Sum();
        return Math.Abs(total - Math.Max(0, turning.Count - 1) * 0.5) < 1e-9;
    }
}

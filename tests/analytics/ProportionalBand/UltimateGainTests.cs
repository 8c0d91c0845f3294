using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.ProportionalBand;
using LoopWatch.Analytics.Tests.Oscillation;

namespace LoopWatch.Analytics.Tests.ProportionalBand;

public sealed class UltimateGainTests
{
    [Fact]
    public void Phase_crossover_cases_with_closed_forms()
    {
        // theta w + atan(tau w) = pi with tau w = 1 needs theta w = 3 pi / 4; there |G| = Kp / sqrt(2), so Ku = sqrt(2) / Kp.
        var (ku, w) = UltimateGain.Of(2, 10, 3 * Math.PI / 4 * 10);
        Assert.Equal(0.1, w, 1e-9);
        Assert.Equal(Math.Sqrt(2) / 2, ku, 1e-9);
        // tau w = sqrt(3): atan = pi / 3, theta w = 2 pi / 3; |G| = Kp / 2, so Ku = 2 / Kp.
        (ku, w) = UltimateGain.Of(0.5, 10, 2 * Math.PI / 3 / (Math.Sqrt(3) / 10));
        Assert.Equal(Math.Sqrt(3) / 10, w, 1e-9);
        Assert.Equal(4, ku, 1e-9);
    }

    /// <summary>Peak-to-peak PV of a finely stepped P-only loop over two windows after a small set-point step.</summary>
    private static (double Early, double Late) Swing(double kc)
    {
        const double dt = 0.01;
        var loop = new PidLoopModel(PidLoopRig.Options(), new PidLoopSetup
        {
            Dt = dt, Kc = kc, TiSeconds = null, ProcessGain = 1, TauSeconds = 20, DeadTimeSeconds = 3, SetPointPct = 50,
            SetPointSteps = [(1, 50.2)],
        });
        double eMin = double.MaxValue, eMax = double.MinValue, lMin = double.MaxValue, lMax = double.MinValue;
        for (var i = 0; i < 16_000; i++)
        {
            var t = i * dt;
            loop.Step(t, dt);
            var pv = loop.TruePvPct;
            if (t is >= 40 and < 80) { eMin = Math.Min(eMin, pv); eMax = Math.Max(eMax, pv); }
            if (t is >= 120 and < 160) { lMin = Math.Min(lMin, pv); lMax = Math.Max(lMax, pv); }
        }
        return (eMax - eMin, lMax - lMin);
    }

    [Theory]
    [InlineData(0.9, false)]
    [InlineData(1.1, true)]
    public void Below_the_ultimate_gain_the_loop_settles_above_it_the_swing_grows(double share, bool grows)
    {
        // Ziegler and Nichols (1942): the ultimate gain is the proportional gain at which the loop holds a steady oscillation.
        var (ku, _) = UltimateGain.Of(1, 20, 3);
        var (early, late) = Swing(share * ku);
        Assert.Equal(grows, late > early);
    }
}

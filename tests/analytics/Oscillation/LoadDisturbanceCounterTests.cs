using LoopWatch.Analytics.Oscillation;

namespace LoopWatch.Analytics.Tests.Oscillation;

public class LoadDisturbanceCounterTests
{
    private const double PeriodS = 60;

    private static LoadDisturbanceCounter Feed(double amplitude, int seconds)
    {
        var counter = new LoadDisturbanceCounter(amplitudePct: 1.0, supervisionPeriods: 50);
        for (var t = 0; t <= seconds; t++)
            counter.Step(PidLoopRig.T0 + t * TimeSpan.TicksPerSecond, amplitude * Math.Sin(2 * Math.PI * (t + 0.3) / PeriodS), PeriodS);
        return counter;
    }

    [Fact]
    public void HalfPeriodIae_OfASinusoid_Is2AOverW()
    {
        var counter = Feed(1.2, 600);
        var w = 2 * Math.PI / PeriodS;

        // Calculus: the integral of |A sin(wt)| over a half period is 2A/w; trapezoids at 60 samples a period are within 0.1 %.
        Assert.Equal(2 * 1.2 / w, counter.LastIae, 2 * 1.2 / w * 1e-3);
        // Hagglund (1995): IAE_lim = 2a/w_u with w_u = 2 pi / T_u.
        Assert.Equal(2 * 1.0 / w, counter.IaeLimit(PeriodS), 1e-9);
    }

    [Fact]
    public void Amplitude1_2_AboveLimit1_IsDetectedEveryHalfPeriod()
    {
        var counter = Feed(1.2, 1800);

        // 2A/w > 2a/w for A = 1.2 > a = 1 (Hagglund 1995): every half period is a load; 30 min of 60 s periods = 60 halves.
        Assert.True(counter.Loads >= 58, $"loads {counter.Loads}");
        // Forgetting x = gamma x + 1, gamma = 1 - 30/3000: after 59 detections x = (1 - 0.99^59)/0.01 = 44.7 > n_lim 10.
        Assert.Equal((1 - Math.Pow(0.99, counter.Loads)) / 0.01, counter.Count, 0.5);
        Assert.True(counter.Count > 10);
    }

    [Fact]
    public void Amplitude0_8_BelowLimit1_IsNeverDetected()
    {
        var counter = Feed(0.8, 1800);

        // 2A/w < 2a/w for A = 0.8 < a = 1 (Hagglund 1995).
        Assert.Equal(0, counter.Loads);
        Assert.Equal(0, counter.Count);
    }
}

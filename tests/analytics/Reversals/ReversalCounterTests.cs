using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Reversals;

public sealed class ReversalCounterTests
{
    /// <summary>A triangle between 50 - a and 50 + a with period p samples, starting at its minimum.</summary>
    internal static double Triangle(long k, double a, int p)
    {
        var phase = k % p;
        return phase <= p / 2 ? 50 - a + 4 * a * phase / p : 50 + a - 4 * a * (phase - p / 2.0) / p;
    }

    [Fact]
    public void Step_TriangleWave_TwoReversalsAndFourAmplitudesOfTravelPerPeriod()
    {
        const double a = 10;
        const int p = 20, periods = 30;
        var c = new ReversalCounter(0.5);
        // N whole periods end at a minimum; one step more confirms that last valley.
        for (long k = 0; k <= periods * p + 1; k++) c.Step(LoopRig.At(k), Triangle(k, a, p));
        // Geometry of a triangle wave: each period turns twice and travels 2A up and 2A down (4A), fact of geometry.
        Assert.Equal(2 * periods, c.Counters.Reversals);
        Assert.Equal(4 * a * periods + 4 * a / p, c.Counters.TravelPct, 9);
        Assert.Equal(periods * p + 2, c.Samples);
        // Rainflow (ASTM E1049-85 5.4.4): equal ranges each close as half cycles, so one full cycle of 2A per period.
        var h = c.Rainflow.Histogram();
        Assert.Equal(periods, h[RainflowCounter.BinOf(2 * a)]);
        Assert.Equal(periods, h.Sum());
    }

    [Fact]
    public void Step_TriangleSmallerThanTheDeadband_CountsNothing()
    {
        // Deadband filter definition: swings (peak to peak 0.4 %) inside a 0.5 % deadband are not moves.
        var c = new ReversalCounter(0.5);
        for (long k = 0; k < 2000; k++) c.Step(LoopRig.At(k), Triangle(k, 0.2, 20));
        Assert.Equal(0, c.Counters.Reversals);
        Assert.Equal(0, c.Counters.TravelPct);
        Assert.Equal(0, c.Rainflow.Histogram().Sum());
    }

    [Fact]
    public void Step_TriangleJustBeyondTheDeadband_CountsEveryTurn()
    {
        // Peak to peak 0.6 % against a 0.5 % deadband: every turn is beyond it (deadband filter definition);
        // the last valley is confirmed 9 steps of 0.06 % after it.
        var c = new ReversalCounter(0.5);
        for (long k = 0; k <= 100 * 20 + 9; k++) c.Step(LoopRig.At(k), Triangle(k, 0.3, 20));
        Assert.Equal(200, c.Counters.Reversals);
    }

    [Fact]
    public void Rates_TriangleOverTwoHours_AreReversalsAndTravelPerPeriodScaledToAnHour()
    {
        var c = new ReversalCounter(0.5);
        for (long k = 0; k < 7200; k++) c.Step(LoopRig.At(k), Triangle(k, 10, 20));
        // 2 reversals and 40 % travel per 20 s period = 360 reversals and 7200 % an hour (triangle geometry).
        Assert.InRange(c.ReversalsPerHour!.Value, 360 * 0.99, 360 * 1.01);
        Assert.InRange(c.TravelPctPerHour!.Value, 7200 * 0.99, 7200 * 1.01);
        Assert.InRange(c.WindowSeconds, 3540, 3600);
    }

    [Fact]
    public void Seed_RestoredCounters_AreContinued()
    {
        var since = LoopRig.At(-86_400);
        var c = new ReversalCounter(0.5);
        c.Seed(new ElementCounters(1_000, 25_000, since));
        for (long k = 0; k <= 10 * 20 + 1; k++) c.Step(LoopRig.At(k), Triangle(k, 10, 20));
        // Triangle geometry: 10 periods add 20 reversals and 400 % (+2 % for the extra step) of travel.
        Assert.Equal(new ElementCounters(1_020, 25_402, since), c.Counters with { TravelPct = Math.Round(c.Counters.TravelPct, 9) });
        Assert.Equal(254.02, c.Counters.Strokes, 9);
    }

    [Fact]
    public void RestartWindow_AfterAGap_RatesStartAfreshButCountersStay()
    {
        var c = new ReversalCounter(0.5);
        for (long k = 0; k < 600; k++) c.Step(LoopRig.At(k), Triangle(k, 10, 20));
        var before = c.Counters;
        c.RestartWindow();
        Assert.Null(c.ReversalsPerHour);
        Assert.Equal(before, c.Counters);
    }
}

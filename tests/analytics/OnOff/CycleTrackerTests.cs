using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.OnOff;

public sealed class CycleTrackerTests
{
    /// <summary>Feeds a square wave on for <paramref name="on"/> s of every <paramref name="period"/> s, PV a triangle 40..60 % over each period.</summary>
    private static long Run(CycleTracker t, long from, long seconds, int on, int period)
    {
        for (var s = from; s < from + seconds; s++)
        {
            var phase = (s - from) % period;
            var pv = phase < period / 2 ? 40 + 40.0 * phase / period : 60 - 40.0 * (phase - period / 2) / period;
            t.Step(LoopRig.At(s), phase < on, pv, true);
        }
        return from + seconds;
    }

    [Fact]
    public void Figures_SquareWave_GivePeriodDutyStartsAndAmplitudeOfTheWave()
    {
        var t = new CycleTracker();
        var end = Run(t, 0, 180 * 13 + 1, on: 60, period: 180);
        var f = t.Figures(LoopRig.At(end - 1), 6);
        // Definitions (common practice, no source): period start to start, starts/hour = 3600 / period,
        // duty = on time / period, amplitude = half the PV peak to peak (40..60 % gives 10 %).
        Assert.Equal(6, f.Cycles);
        Assert.Equal(180, f.PeriodS!.Value, 9);
        Assert.Equal(20, f.StartsPerHour!.Value, 9);
        Assert.Equal(100.0 / 3, f.DutyPct!.Value, 9);
        Assert.Equal(10, f.AmplitudePct!.Value, 9);
        Assert.Equal(0, f.StartsPerHourTrend!.Value, 9);
        // The first sample shows the element on but not its start: 13 starts, 12 complete cycles.
        Assert.Equal(13, t.Starts);
        Assert.Equal(12, t.CompletedCycles);
    }

    [Fact]
    public void Figures_CyclingSpeedsUp_TrendIsRecentMinusOlderStartsPerHour()
    {
        var t = new CycleTracker();
        var end = Run(t, 0, 180 * 10, on: 60, period: 180);
        end = Run(t, end, 90 * 6 + 1, on: 30, period: 90);
        var f = t.Figures(LoopRig.At(end - 1), 6);
        // 3600/90 - 3600/180 = 40 - 20 starts an hour (definition of the trend, recent minus older).
        Assert.Equal(40, f.StartsPerHour!.Value, 9);
        Assert.Equal(20, f.StartsPerHourTrend!.Value, 9);
    }

    [Fact]
    public void Figures_CyclingStops_StartsPerHourFallWithTheOpenCycle()
    {
        var t = new CycleTracker();
        var end = Run(t, 0, 180 * 7 + 1, on: 60, period: 180);
        for (var s = end; s < end + 3600; s++) t.Step(LoopRig.At(s), false, 50, true);
        var f = t.Figures(LoopRig.At(end + 3599), 6);
        // The open cycle (about 3600 s) replaces the oldest of six 180 s cycles: 3600 / ((5 * 180 + 3600) / 6).
        Assert.InRange(f.StartsPerHour!.Value, 4.79, 4.81);
        Assert.Equal(180, f.PeriodS!.Value, 9);
    }

    [Fact]
    public void Step_FirstSampleOn_IsNotCountedAsAStart()
    {
        var t = new CycleTracker();
        t.Step(LoopRig.At(0), true, 50, true);
        t.Step(LoopRig.At(1), false, 50, true);
        t.Step(LoopRig.At(2), true, 50, true);
        Assert.Equal(1, t.Starts);
        Assert.Equal(0, t.CompletedCycles);
    }

    [Fact]
    public void IsOn_FlagOrPercent_ReadsOnlyOneAndHalfScaleUpAsOn()
    {
        var d = new ShortCyclingDetector(LoopRig.Define("on-off", "level"));
        // Trade convention: a two-position output is 0/1 or 0/100 %.
        Assert.True(d.IsOn(1));
        Assert.True(d.IsOn(100));
        Assert.True(d.IsOn(50));
        Assert.False(d.IsOn(0));
        Assert.False(d.IsOn(20));
    }
}

using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Tests.Reversals;

namespace LoopWatch.Analytics.Tests.Monitoring;

public sealed class DataGapTests
{
    [Fact]
    public void OnOffLoop_StaleGap_DoesNotCountTheGapAsACycle()
    {
        var spec = LoopRig.Define("on-off", "level", min: 0, max: 3);
        var detector = new ShortCyclingDetector(spec);
        var rig = new LoopRig(spec, detector);
        void Cycles(long from, int count)
        {
            for (var s = from; s < from + count * 300L; s++) rig.Feed(s, 1.2, double.NaN, (s - from) % 300 < 100 ? 100 : 0);
        }
        Cycles(0, 8);
        // Ten minutes without data (beyond the 30 s stale default): the cycle open at the gap is dropped.
        Cycles(2400 + 600, 4);
        // Before: 7 starts seen (the first sample shows the pump on, not its start), 6 complete cycles. After: the first
        // sample again tells no start, so 3 starts and 2 cycles; a cycle across the gap would make it 10.
        Assert.Equal(6 + 2, detector.Tracker.CompletedCycles);
        // Square wave of 300 s (definition of the period, common practice, no source).
        Assert.Equal(300, detector.Figures.PeriodS!.Value, 9);
    }

    [Fact]
    public void PidLoop_StaleGap_RestartsTheRateWindowButKeepsTheLifetimeCounters()
    {
        var spec = LoopRig.Define("pid", "flow");
        var detector = new ReversalDetector(spec);
        var rig = new LoopRig(spec, detector);
        for (var s = 0; s <= 20 * 30; s++) rig.Feed(s, 50, 50, ReversalCounterTests.Triangle(s, 3, 20));
        var before = detector.Output.Counters;
        rig.Feed(20 * 30 + 3600, 50, 50, 47);
        rig.Feed(20 * 30 + 3601, 50, 50, 47);
        Assert.Equal(before.Reversals, detector.Output.Counters.Reversals);
        // After the restart the window holds one second, without any reversal.
        Assert.Equal(0, detector.Output.ReversalsPerHour);
        Assert.InRange(detector.Output.WindowSeconds, 0.5, 1.5);
    }

    [Fact]
    public void Stale_raised_on_the_clock_while_values_were_held_up_ends_with_the_first_newer_value()
    {
        // A broker outage: the plant clock runs on, the loop goes stale, then the queued values arrive one second apart
        // in event time, so no gap in the data itself is longer than StaleSeconds (30 s default).
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        for (var s = 0; s < 60; s++) rig.Feed(s, 50, 50, 40);
        rig.Monitor.Advance(LoopRig.At(59 + 45));
        Assert.True(rig.Monitor.IsStale);
        rig.Feed(60, 50, 50, 40);
        Assert.False(rig.Monitor.IsStale);
        var ended = Assert.Single(rig.Ended(Analytics.Findings.FindingKinds.Stale));
        Assert.Equal(new DateTimeOffset(LoopRig.At(60), TimeSpan.Zero), ended.End);
    }
}

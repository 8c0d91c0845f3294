using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Reversals;

public sealed class ReversalDetectorTests
{
    [Fact]
    public void HuntingOutput_RaisesExcessiveReversalsAfterTenMinutes_AndEndsWhenItSettles()
    {
        var spec = LoopRig.Define("pid", "flow", position: true);
        var detector = new ReversalDetector(spec);
        var rig = new LoopRig(spec, detector);
        // Triangle of 20 s period: 2 reversals a period = 360 an hour (triangle geometry), above the flow default of 200.
        for (var s = 0; s < 1800; s++)
        {
            var op = ReversalCounterTests.Triangle(s, 3, 20);
            rig.Feed(s, 50, 50, op, position: op);
        }
        var f = Assert.IsType<ExcessiveReversalsFinding>(Assert.Single(rig.Raised(FindingKinds.ExcessiveReversals)));
        Assert.Equal(LoopRig.At(600), f.Start.UtcTicks);
        Assert.InRange(f.ReversalsPerHour, 350, 365);
        // 4A = 12 % travel per period, 180 periods an hour.
        Assert.InRange(f.TravelPctPerHour, 2160 * 0.98, 2160 * 1.02);
        Assert.Equal(200, f.MaxReversalsPerHour);
        Assert.InRange(f.PositionReversalsPerHour!.Value, 350, 365);
        Assert.Contains("reversals a minute", f.Diagnosis);
        Assert.Equal(detector.Output.Counters, detector.Position!.Counters);

        for (var s = 1800; s < 7200; s++) rig.Feed(s, 50, 50, 50, position: 50);
        Assert.Single(rig.Ended(FindingKinds.ExcessiveReversals));
        Assert.False(rig.Monitor.Board.IsActive(FindingKinds.ExcessiveReversals));
        var stats = rig.Monitor.Statistics();
        Assert.Equal(0, stats.ReversalsPerHour!.Value, 9);
        Assert.Equal(0, stats.TravelPctPerHour!.Value, 9);
    }

    [Fact]
    public void Seed_BeforeTheFirstSample_CountersCarryOn()
    {
        var spec = LoopRig.Define("pid", "flow");
        var detector = new ReversalDetector(spec);
        var since = LoopRig.At(-3600);
        detector.Seed(new ElementCounters(500, 1_000, since));
        var rig = new LoopRig(spec, detector);
        for (var s = 0; s <= 20 * 10 + 1; s++) rig.Feed(s, 50, 50, ReversalCounterTests.Triangle(s, 3, 20));
        // Triangle geometry: 10 periods are 20 reversals and 120 % of travel (+0.6 % for the step past the last valley).
        Assert.Equal(520, detector.Output.Counters.Reversals);
        Assert.Equal(1_120.6, detector.Output.Counters.TravelPct, 9);
        Assert.Equal(since, detector.Output.Counters.SinceTicks);
        Assert.Null(detector.Position);
    }
}

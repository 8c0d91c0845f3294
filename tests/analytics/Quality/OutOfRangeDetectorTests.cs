using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Quality;

public sealed class OutOfRangeDetectorTests
{
    [Fact]
    public void PvAboveRangeForFiveSamples_Raises_AndFiveSamplesBackInsideEndIt()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow", min: 0, max: 250));
        for (var s = 0; s < 10; s++) rig.Feed(s, 120, 120, 50);
        // 1 % of a 250 span is 2.5: 253 is beyond it (tolerance as documented; common practice, no source).
        for (var s = 10; s < 13; s++) rig.Feed(s, 253, 120, 50);
        Assert.Empty(rig.Raised(FindingKinds.OutOfRange));
        rig.Feed(13, 256, 120, 50);
        rig.Feed(14, 254, 120, 50);
        var f = Assert.IsType<OutOfRangeFinding>(Assert.Single(rig.Raised(FindingKinds.OutOfRange)));
        Assert.Equal(LoopRig.At(14), f.Start.UtcTicks);
        Assert.Equal(256, f.Pv);
        for (var s = 15; s < 19; s++) rig.Feed(s, 120, 120, 50);
        Assert.Empty(rig.Ended(FindingKinds.OutOfRange));
        rig.Feed(19, 120, 120, 50);
        Assert.Equal(LoopRig.At(19), Assert.Single(rig.Ended(FindingKinds.OutOfRange)).End!.Value.UtcTicks);
    }

    [Fact]
    public void PvBelowRange_BrokenLoop_Raises()
    {
        // A 4-20 mA loop that breaks reads below 4 mA, i.e. below range (NAMUR NE 43: 3.6 mA and less is a failure, from memory).
        var rig = new LoopRig(LoopRig.Define("pid", "level", min: 0, max: 5));
        for (var s = 0; s < 10; s++) rig.Feed(s, -0.3, 2, 50);
        var f = Assert.IsType<OutOfRangeFinding>(Assert.Single(rig.Raised(FindingKinds.OutOfRange)));
        Assert.Equal(-0.3, f.Pv);
        Assert.Contains("outside its range 0..5 m", f.Diagnosis);
    }

    [Fact]
    public void PvJustBeyondTheRangeWithinTheTolerance_IsNotOutOfRange()
    {
        // Transmitters read a little over range (NAMUR NE 43 allows 3.8-20.5 mA as measurement, from memory); 0.8 % over is inside the 1 % tolerance.
        var rig = new LoopRig(LoopRig.Define("pid", "flow", min: 0, max: 250));
        for (var s = 0; s < 100; s++) rig.Feed(s, 252, 250, 100);
        Assert.Empty(rig.Raised(FindingKinds.OutOfRange));
    }
}

using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Quality;

public sealed class SaturationDetectorTests
{
    [Fact]
    public void OutputAtHighLimitInAuto_RaisesAfterTenWholeMinutes_AndEndsBelowFortyPercent()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow", mode: true));
        // Windup / lost control: output pinned at 100 % while in auto (ISA-5.1 output range 0-100 %; thresholds common practice, no source).
        for (var s = 0; s < 900; s++) rig.Feed(s, 40, 60, 100, LoopMode.Auto);
        var f = Assert.IsType<SaturationFinding>(Assert.Single(rig.Raised(FindingKinds.Saturation)));
        Assert.Equal(LoopRig.At(600), f.Start.UtcTicks);
        Assert.Equal("high", f.Limit);
        Assert.Equal(100, f.SaturatedPct);
        for (var s = 900; s < 1800; s++) rig.Feed(s, 60, 60, 50, LoopMode.Auto);
        // Saturated minutes 0-14: the window of minutes 12-21, judged at minute 22, is the first below 40 %.
        Assert.Equal(LoopRig.At(22 * 60), Assert.Single(rig.Ended(FindingKinds.Saturation)).End!.Value.UtcTicks);
        var stats = rig.Monitor.Statistics();
        Assert.Equal(100.0 * 900 / 1800, stats.SaturatedPct!.Value, 9);
        Assert.Equal(100, stats.TimeInAutoPct!.Value, 9);
    }

    [Fact]
    public void OutputAtLimitInManual_IsNoFinding_ButCountsInTheStatistics()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow", mode: true));
        for (var s = 0; s < 1200; s++) rig.Feed(s, 40, 60, 0, LoopMode.Manual);
        Assert.Empty(rig.Raised(FindingKinds.Saturation));
        var stats = rig.Monitor.Statistics();
        Assert.Equal(100, stats.SaturatedPct!.Value, 9);
        Assert.Equal(0, stats.TimeInAutoPct!.Value, 9);
    }

    [Fact]
    public void TimeInAuto_WithoutAModeTag_IsNull()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        for (var s = 0; s < 120; s++) rig.Feed(s, 40, 60, 99.6);
        var stats = rig.Monitor.Statistics();
        Assert.Null(stats.TimeInAutoPct);
        Assert.Equal(100, stats.SaturatedPct!.Value, 9);
    }
}

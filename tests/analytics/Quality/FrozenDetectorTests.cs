using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Quality;

public sealed class FrozenDetectorTests
{
    [Fact]
    public void PvConstantWhileOutputRamps_RaisesFrozenAt120Samples_AndEndsWhenPvMoves()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        // Fact of the trade (common practice, no source): a live process answers a moving valve; a transmitter that does not is stuck.
        for (var s = 0; s < 200; s++) rig.Feed(s, 42.0, 42, 40 + s * 0.1);
        var f = Assert.IsType<FrozenFinding>(Assert.Single(rig.Raised(FindingKinds.Frozen)));
        Assert.Equal(LoopRig.At(119), f.Start.UtcTicks);
        Assert.Equal(120, f.Samples);
        Assert.True(f.OpMovePct > 5);
        Assert.Equal(42.0, f.Pv);
        rig.Feed(200, 42.5, 42, 60);
        var ended = Assert.Single(rig.Ended(FindingKinds.Frozen));
        Assert.Equal(LoopRig.At(200), ended.End!.Value.UtcTicks);
    }

    [Fact]
    public void PvConstantWithOutputSteady_IsNotFrozen()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        // A steady output and a steady PV is a quiet plant, not a stuck transmitter (common practice, no source).
        for (var s = 0; s < 600; s++) rig.Feed(s, 42.0, 42, 50 + (s % 2) * 0.5);
        Assert.Empty(rig.Raised(FindingKinds.Frozen));
    }

    [Fact]
    public void PvWithTinyChangesBeyondTheTolerance_IsNotFrozen()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        for (var s = 0; s < 600; s++) rig.Feed(s, 42.0 + (s % 2) * 0.02, 42, 40 + s * 0.05);
        Assert.Empty(rig.Raised(FindingKinds.Frozen));
    }
}

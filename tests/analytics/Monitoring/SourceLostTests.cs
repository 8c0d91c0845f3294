using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Monitoring;

public sealed class SourceLostTests
{
    private static long At(LoopRig rig, double seconds) => rig.Start + (long)(seconds * TimeSpan.TicksPerSecond);

    [Fact]
    public void SourceLost_IsStaleAtTheDeathTime_AndOnlyTheLostSignalEndsIt()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        for (var s = 0; s < 10; s++) rig.Feed(s, 50, 50, 40);
        var samples = rig.Monitor.Snapshot.Samples;

        // A death certificate (Sparkplug 3.0, 6.4.25 DDEATH) says the PV's source is gone: stale now, not after the 30 s default.
        rig.Monitor.SourceLost(Signal.Pv, At(rig, 10), "Quillmoor/Intake/Skid1");
        var stale = Assert.IsType<SourceOfflineFinding>(Assert.Single(rig.Raised(FindingKinds.Stale)));
        Assert.Equal(new DateTimeOffset(At(rig, 10), TimeSpan.Zero), stale.Start);
        Assert.Equal("Quillmoor/Intake/Skid1", stale.Source);

        // The output's source still talks; that neither ends the stale state nor feeds the detectors a frozen PV.
        for (var s = 11; s < 20; s++)
        {
            rig.Monitor.Update(Signal.Op, At(rig, s), 41);
            rig.Monitor.Update(Signal.Sp, At(rig, s), 50);
        }
        rig.Monitor.Advance(At(rig, 20));
        Assert.True(rig.Monitor.IsStale);
        Assert.Empty(rig.Ended(FindingKinds.Stale));
        Assert.Equal(samples, rig.Monitor.Snapshot.Samples);

        // The PV comes back (a rebirth): the stale state ends at that value's time and sampling resumes.
        rig.Feed(21, 51, 50, 41);
        Assert.False(rig.Monitor.IsStale);
        Assert.Equal(new DateTimeOffset(At(rig, 21), TimeSpan.Zero), Assert.Single(rig.Ended(FindingKinds.Stale)).End);
        Assert.Equal(samples + 1, rig.Monitor.Snapshot.Samples);
    }
}

using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Monitoring;

/// <summary>
/// Values that arrive out of time order or twice: the held value of a tag is always its newest by time stamp (a fact of
/// the trade for any historian or DCS trend, common practice, no source).
/// </summary>
public sealed class OutOfOrderTests
{
    private static long At(double seconds) => LoopRig.T0 + (long)Math.Round(seconds * TimeSpan.TicksPerSecond);

    [Fact]
    public void An_older_value_of_the_same_interval_arriving_later_is_late_and_does_not_replace_the_newer_one()
    {
        var monitor = new LoopMonitor(LoopRig.Define("pid", "flow"));
        monitor.Update(Signal.Pv, At(10.6), 61);
        monitor.Update(Signal.Pv, At(10.2), 59); // sent earlier, delayed on the way
        Assert.Equal(61, monitor.Snapshot.Pv);
        Assert.Equal(1, monitor.Snapshot.LateValues);

        // Each tag keeps its own order: an SP older than the PV's time is the SP's newest, so it is taken.
        monitor.Update(Signal.Sp, At(10.1), 60);
        Assert.Equal(60, monitor.Snapshot.Sp);
        Assert.Equal(1, monitor.Snapshot.LateValues);
    }

    [Fact]
    public void A_value_sent_again_changes_nothing_whether_it_comes_at_once_or_after_newer_ones()
    {
        var rig = new LoopRig(LoopRig.Define("pid", "flow"));
        var twin = new LoopRig(LoopRig.Define("pid", "flow"));
        for (var s = 0; s < 120; s++)
        {
            var pv = 50 + 5 * Math.Sin(s / 7.0);
            rig.Feed(s, pv, 50, 40 + s % 9);
            twin.Feed(s, pv, 50, 40 + s % 9);
            // The twin gets PV again (QoS 1 at least once): at once, and a second later after the newer values.
            twin.Monitor.Update(Signal.Pv, At(s), pv);
            if (s > 0) twin.Monitor.Update(Signal.Pv, At(s - 1), 50 + 5 * Math.Sin((s - 1) / 7.0));
        }
        Assert.Equal(rig.Monitor.Snapshot with { LateValues = 0 }, twin.Monitor.Snapshot with { LateValues = 0 });
        Assert.Equal(119, twin.Monitor.Snapshot.LateValues);
        Assert.Equal(rig.Changes.Count, twin.Changes.Count);
    }
}

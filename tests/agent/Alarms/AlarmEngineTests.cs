using LoopWatch.Agent.Alarms;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Offset;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Sampling;
using static LoopWatch.Agent.Tests.Alarms.AlarmRig;

namespace LoopWatch.Agent.Tests.Alarms;

public sealed class AlarmEngineTests
{
    private static OffsetFinding Offset(long ticks) =>
        new(new DateTimeOffset(ticks, TimeSpan.Zero), null, 2.05, 600, 0, OffsetCauses.NoIntegralAction);

    // A sustained offset that is active 20 s then drops out for 5 s, for 10 minutes; the figure sits just above the
    // 2 % limit while active and just below it (1.98 %) while ended: a finding flickering around its threshold.
    private static int Activations(AlarmOptions alarms)
    {
        var sink = new ListSink();
        var engine = new AlarmEngine([Spec(alarms: alarms)], [sink]);
        var loop = engine.Loop("FIC-950")!;
        var board = new FindingBoard("FIC-950", null);
        for (var s = 0; s < 600; s++)
        {
            var t = At(s);
            var on = s % 25 < 20;
            if (on) board.Set(Offset(t)); else board.End(FindingKinds.SustainedOffset, new DateTimeOffset(t, TimeSpan.Zero));
            var figure = on ? 2.05 : 1.98;
            loop.Evaluate(t, LoopMode.Auto, board, () => new LoopStatistics { MeanErrorPct = figure }, 100);
        }
        return sink.Activations;
    }

    [Fact]
    public void Delays_stop_a_flickering_finding_from_chattering()
    {
        var bare = Activations(new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0, DeadbandPct = 0 });
        var delayed = Activations(new AlarmOptions { OnDelaySeconds = 15, OffDelaySeconds = 15, DeadbandPct = 0 });
        // 600 s / 25 s = 24 raises: without delay each is an activation; 3 or more in 60 s is chattering
        // (common practice, no source). The 15 s flow off-delay (ISA-18.2 / EEMUA 191 guidance, from memory) rides out 5 s dropouts.
        Assert.Equal(24, bare);
        Assert.Equal(1, delayed);
    }

    [Fact]
    public void Deadband_holds_the_alarm_while_the_figure_stays_within_it()
    {
        var bare = Activations(new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0, DeadbandPct = 0 });
        // Flow deadband 5 % (ISA-18.2 / EEMUA 191 guidance, from memory): to clear, 1.98 must drop below 2 x 0.95 = 1.9.
        var banded = Activations(new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0, DeadbandPct = 5 });
        Assert.Equal(24, bare);
        Assert.Equal(1, banded);
    }

    [Fact]
    public void On_delay_counts_event_time_not_calls()
    {
        var sink = new ListSink();
        var loop = new AlarmEngine([Spec()], [sink]).Loop("FIC-950")!; // flow: 15 s on-delay by default
        var board = new FindingBoard("FIC-950", null);
        board.Set(Offset(At(0)));
        loop.Evaluate(At(0), LoopMode.Auto, board);
        loop.Evaluate(At(14.9), LoopMode.Auto, board);
        Assert.Empty(sink.All);
        loop.Evaluate(At(15), LoopMode.Auto, board);
        var t = Assert.Single(sink.All);
        Assert.Equal(AlarmState.Unacknowledged, t.After.State);
        Assert.Equal(At(15), t.Ticks);
        Assert.Contains("\"offset_pct\":2.05", t.After.FiguresJson);
    }

    [Fact]
    public void Manual_mode_suppresses_and_return_to_auto_does_not_replay_old_alarms()
    {
        var sink = new ListSink();
        var loop = new AlarmEngine([Spec(alarms: new AlarmOptions { OnDelaySeconds = 10, OffDelaySeconds = 10 })], [sink]).Loop("FIC-950")!;
        var board = new FindingBoard("FIC-950", null);
        board.Set(Offset(At(0)));
        for (var s = 0; s <= 20; s++) loop.Evaluate(At(s), LoopMode.Auto, board);
        Assert.Equal(1, sink.Activations);

        // In manual for 10 minutes while the finding comes and goes: nothing activates (design suppression, ISA-18.2).
        for (var s = 21; s < 621; s++)
        {
            if (s % 60 == 0) board.End(FindingKinds.SustainedOffset, new DateTimeOffset(At(s), TimeSpan.Zero));
            if (s % 60 == 30) board.Set(Offset(At(s)));
            loop.Evaluate(At(s), LoopMode.Manual, board);
        }
        Assert.Equal(1, sink.Activations);
        var suppressed = sink.All.Where(t => t.After.Kind == FindingKinds.SustainedOffset).Last();
        Assert.Equal(AlarmState.SuppressedByDesign, suppressed.After.State);

        // Back in auto with the finding gone: no activation at all, the alarm just returns to normal.
        board.End(FindingKinds.SustainedOffset, new DateTimeOffset(At(621), TimeSpan.Zero));
        for (var s = 621; s < 700; s++) loop.Evaluate(At(s), LoopMode.Auto, board);
        Assert.Equal(1, sink.Activations);
        var status = new List<AlarmStatus>();
        loop.Collect(status);
        Assert.Equal(AlarmState.Normal, status.Single(a => a.Kind == FindingKinds.SustainedOffset).State);

        // With the finding active on return it comes back once, after a fresh on-delay, not as a burst.
        board.Set(Offset(At(700)));
        for (var s = 700; s < 720; s++) loop.Evaluate(At(s), LoopMode.Auto, board);
        var again = sink.All.Where(t => t.Trigger == AlarmTrigger.Activate).Last();
        Assert.Equal(2, sink.Activations);
        Assert.Equal(At(710), again.Ticks);
    }

    [Fact]
    public void Stale_data_suppresses_other_alarms_but_raises_its_own()
    {
        var sink = new ListSink();
        var loop = new AlarmEngine([Spec(alarms: new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 })], [sink]).Loop("FIC-950")!;
        var board = new FindingBoard("FIC-950", null);
        board.Set(Offset(At(0)));
        loop.Evaluate(At(0), LoopMode.Auto, board);
        board.Set(new StaleFinding(new DateTimeOffset(At(1), TimeSpan.Zero), null, 30));
        loop.Evaluate(At(31), LoopMode.Auto, board);
        var states = new List<AlarmStatus>();
        loop.Collect(states);
        Assert.Equal(AlarmState.SuppressedByDesign, states.Single(a => a.Kind == FindingKinds.SustainedOffset).State);
        Assert.Equal(AlarmState.Unacknowledged, states.Single(a => a.Kind == FindingKinds.Stale).State);
    }

    [Fact]
    public void Outside_the_operating_window_alarms_are_suppressed()
    {
        var sink = new ListSink();
        var loop = new AlarmEngine([Spec(alarms: new AlarmOptions { OnDelaySeconds = 0, ActiveWhen = ["06:00-22:00"] })], [sink]).Loop("FIC-950")!;
        var board = new FindingBoard("FIC-950", null);
        board.Set(Offset(At(0)));
        loop.Evaluate(At(0), LoopMode.Auto, board); // 00:00 UTC: outside
        Assert.Equal(0, sink.Activations);
        loop.Evaluate(At(6 * 3600), LoopMode.Auto, board); // 06:00: inside
        Assert.Equal(1, sink.Activations);
    }

    [Fact]
    public void A_shelved_alarm_returns_when_the_shelf_expires_in_event_time()
    {
        var sink = new ListSink();
        var engine = new AlarmEngine([Spec(alarms: new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 })], [sink]);
        var loop = engine.Loop("FIC-950")!;
        var board = new FindingBoard("FIC-950", null);
        board.Set(Offset(At(0)));
        loop.Evaluate(At(0), LoopMode.Auto, board);
        var shelved = engine.Act("FIC-950:sustained-offset", AlarmTrigger.Shelve, At(10), "op.two", "known, valve job booked", At(10 + 3600));
        Assert.True(shelved.Accepted);
        loop.Evaluate(At(3000), LoopMode.Auto, board);
        Assert.Equal(1, sink.Activations);
        loop.Evaluate(At(3610), LoopMode.Auto, board);
        Assert.Equal(2, sink.Activations); // back from the shelf and still active: annunciated again
        Assert.Contains(sink.All, t => t.Trigger == AlarmTrigger.Unshelve && t.Comment == "shelf expired");
        Assert.Equal("op.two", sink.All.Single(t => t.Trigger == AlarmTrigger.Shelve).User);
    }
}

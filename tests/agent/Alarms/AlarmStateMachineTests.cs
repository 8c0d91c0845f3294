using LoopWatch.Agent.Alarms;
using static LoopWatch.Agent.Alarms.AlarmState;
using static LoopWatch.Agent.Alarms.AlarmTrigger;

namespace LoopWatch.Agent.Tests.Alarms;

public sealed class AlarmStateMachineTests
{
    // The ISA-18.2 / IEC 62682 alarm state diagram (from memory): A normal, B unacknowledged, C acknowledged,
    // D returned-to-normal unacknowledged, E shelved, F suppressed by design, G out of service.
    public static TheoryData<AlarmState, AlarmTrigger, AlarmState> Allowed => new()
    {
        { Normal, Activate, Unacknowledged },                 // A -> B: process condition becomes abnormal
        { Unacknowledged, Acknowledge, Acknowledged },        // B -> C: operator acknowledges while active
        { Unacknowledged, Clear, ReturnedUnacknowledged },    // B -> D: returns before acknowledgement
        { Acknowledged, Clear, Normal },                      // C -> A: returns after acknowledgement
        { ReturnedUnacknowledged, Acknowledge, Normal },      // D -> A: acknowledged after return
        { ReturnedUnacknowledged, Activate, Unacknowledged }, // D -> B: re-alarm before acknowledgement
        { Normal, Shelve, Shelved }, { Unacknowledged, Shelve, Shelved }, { Acknowledged, Shelve, Shelved },
        { ReturnedUnacknowledged, Shelve, Shelved }, { Shelved, Unshelve, Normal },
        { Normal, Suppress, SuppressedByDesign }, { Unacknowledged, Suppress, SuppressedByDesign },
        { Acknowledged, Suppress, SuppressedByDesign }, { ReturnedUnacknowledged, Suppress, SuppressedByDesign },
        { SuppressedByDesign, Unsuppress, Normal },
        { Normal, RemoveFromService, OutOfService }, { Unacknowledged, RemoveFromService, OutOfService },
        { Acknowledged, RemoveFromService, OutOfService }, { ReturnedUnacknowledged, RemoveFromService, OutOfService },
        { Shelved, RemoveFromService, OutOfService }, { SuppressedByDesign, RemoveFromService, OutOfService },
        { OutOfService, ReturnToService, Normal },
    };

    [Theory]
    [MemberData(nameof(Allowed))]
    public void Every_transition_of_the_state_diagram_is_allowed(AlarmState from, AlarmTrigger trigger, AlarmState to)
    {
        Assert.True(AlarmStateMachine.TryNext(from, trigger, out var next));
        Assert.Equal(to, next);
    }

    [Fact]
    public void Every_pair_outside_the_diagram_is_refused()
    {
        var allowed = Allowed.Select(r => ((AlarmState)r[0], (AlarmTrigger)r[1])).ToHashSet();
        var refused = 0;
        foreach (var s in Enum.GetValues<AlarmState>())
            foreach (var t in Enum.GetValues<AlarmTrigger>())
            {
                if (allowed.Contains((s, t))) continue;
                Assert.False(AlarmStateMachine.TryNext(s, t, out var next), $"{s} + {t}");
                Assert.Equal(s, next);
                refused++;
            }
        // 7 states x 9 triggers = 63 pairs, 23 in the diagram (ISA-18.2 model as listed above).
        Assert.Equal(63 - 23, refused);
        Assert.Equal(23, AlarmStateMachine.Table.Count);
    }

    [Fact]
    public void Acknowledging_a_normal_alarm_is_refused_with_a_reason_not_an_exception()
    {
        var sink = new AlarmRig.ListSink();
        var engine = new AlarmEngine([AlarmRig.Spec()], [sink]);
        // ISA-18.2: only an unacknowledged alarm can be acknowledged; a normal one has nothing to acknowledge.
        var r = engine.Act("FIC-950:oscillation", Acknowledge, AlarmRig.At(0), "op.one", null);
        Assert.False(r.Accepted);
        Assert.Contains("not allowed in state normal", r.Refusal);
        Assert.Empty(sink.All);
        Assert.False(engine.Act("FIC-950:nonsense", Acknowledge, AlarmRig.At(0), "op.one", null).Accepted);
    }
}

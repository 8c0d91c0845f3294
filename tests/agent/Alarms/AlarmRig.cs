using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Tests.Alarms;

/// <summary>Builds checked loop specs and collects alarm transitions for the alarm tests.</summary>
public static class AlarmRig
{
    public static readonly long T0 = new DateTimeOffset(2026, 3, 2, 0, 0, 0, TimeSpan.Zero).UtcTicks;

    public static long At(double seconds) => T0 + (long)(seconds * TimeSpan.TicksPerSecond);

    public static LoopSpec Spec(string id = "FIC-950", AlarmOptions? alarms = null)
    {
        var o = TestLoops.Pid(id);
        o.Alarms = alarms;
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check([o], errors);
        Assert.Empty(errors);
        return specs[0];
    }

    public sealed class ListSink : IAlarmSink
    {
        public List<AlarmTransition> All { get; } = [];
        public void Transitioned(in AlarmTransition transition) => All.Add(transition);
        public int Activations => All.Count(t => t.Trigger == AlarmTrigger.Activate);
    }
}

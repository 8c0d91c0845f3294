using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.OnOff;

/// <summary>The fictional wet well W-3 of unit 3 (a <see cref="SumpModel"/>) fed to a rig as its tags would arrive.</summary>
internal static class SumpFeed
{
    /// <summary>The well's loop as the agent would read it, 0-3 m.</summary>
    public static LoopOptions Options() => new() { Id = "LS-310", Kind = "on-off", Pv = new SignalOptions { Tag = "u3/loop/pv", Min = 0, Max = 3 } };

    /// <summary>Runs <paramref name="sump"/> for <paramref name="hours"/>: the model steps at 0.1 s, the agent samples it once a second.</summary>
    public static void Run(SumpModel sump, LoopRig rig, double hours)
    {
        for (long i = 0; i < (long)(hours * 36_000); i++)
        {
            sump.Step(i * 0.1, 0.1);
            if (i % 10 == 9) rig.Feed((i + 1) / 10, sump.Reading.Pv, double.NaN, sump.Reading.Op);
        }
    }
}

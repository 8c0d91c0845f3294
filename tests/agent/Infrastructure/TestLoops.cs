using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Loop definitions for tests (fictional tags).</summary>
public static class TestLoops
{
    public static LoopOptions Pid(string id, string root = "test") => new()
    {
        Id = id, Description = $"{id} test loop", Area = "Test area", Kind = "pid", Process = "flow",
        Pv = new SignalOptions { Tag = $"{root}/{id}/pv", Min = 0, Max = 200, Unit = "m3/h" },
        Sp = new SignalOptions { Tag = $"{root}/{id}/sp" },
        Op = new SignalOptions { Tag = $"{root}/{id}/op" },
        Mode = new SignalOptions { Tag = $"{root}/{id}/mode" },
    };
}

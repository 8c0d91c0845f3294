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

    /// <summary>A pid loop that goes stale 2 s after its last value and alarms at once (no on- or off-delay).</summary>
    public static LoopOptions FastStale(string id)
    {
        var o = Pid(id);
        o.Limits = new LimitOptions { StaleSeconds = 2 };
        o.Alarms = new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 };
        return o;
    }
}

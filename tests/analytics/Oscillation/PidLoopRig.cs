using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.Oscillation;

/// <summary>A pid loop of the fictional plant fed through a real <see cref="LoopMonitor"/> at 1 s, recording every finding change.</summary>
internal sealed class PidLoopRig
{
    /// <summary>Event time zero of every run.</summary>
    public static readonly long T0 = new DateTime(2026, 3, 2, 6, 0, 0, DateTimeKind.Utc).Ticks;

    /// <summary>A rig with the loop's standard detectors, or with <paramref name="detectors"/> when given (to read their state).</summary>
    public PidLoopRig(LoopSpec spec, params LoopDetector[] detectors) => _rig = new LoopRig(spec, T0, detectors);

    // The monitor, the change log and the feeding order are the general rig's; this one adds pid helpers and its own T0.
    private readonly LoopRig _rig;

    public LoopSpec Spec => _rig.Spec;
    public LoopMonitor Monitor => _rig.Monitor;
    public List<FindingChange> Changes => _rig.Changes;

    /// <summary>The changes of one kind that raised a finding.</summary>
    public IEnumerable<T> Raised<T>() where T : Finding =>
        Changes.Where(c => c.Change == FindingChangeKind.Raised).Select(c => c.Finding).OfType<T>();

    /// <summary>The finding of type T active at the end, or null.</summary>
    public T? Active<T>() where T : Finding => Monitor.Board.Active.OfType<T>().SingleOrDefault();

    /// <summary>Feeds one sampling instant at second <paramref name="second"/>: PV and SP in engineering units, OP in %.</summary>
    public void Feed(long second, double pv, double sp, double op, LoopMode? mode = null) => _rig.Feed(second, pv, sp, op, mode);

    /// <summary>Runs a simulated loop for <paramref name="seconds"/> s, feeding what it shows after each step.</summary>
    public void Run(SimulatedLoop loop, long seconds, long from = 0)
    {
        for (var t = from; t < from + seconds; t++)
        {
            loop.Step(t, 1);
            var r = loop.Reading;
            Feed(t, r.Pv, r.Sp, r.Op, Spec.ModeTag is null ? null : r.Mode);
        }
    }

    /// <summary>A checked pid loop spec through <see cref="LoopOptionsCheck"/>, PV range <paramref name="min"/>..<paramref name="max"/>.</summary>
    public static LoopSpec Pid(string process = "flow", double min = 0, double max = 100, double? ti = null, double? kc = null, bool mode = false) =>
        Check(Options(process, min, max, ti, kc, mode));

    /// <summary>Loop options as the agent would read them for the fictional loop FIC-210 of unit 2.</summary>
    public static LoopOptions Options(string process = "flow", double min = 0, double max = 100, double? ti = null, double? kc = null, bool mode = false) => new()
    {
        Id = "FIC-210",
        Description = "Feed to column C-2",
        Area = "unit-2",
        Kind = "pid",
        Process = process,
        Pv = new SignalOptions { Tag = "u2/fic210/pv", Min = min, Max = max, Unit = "m3/h" },
        Sp = new SignalOptions { Tag = "u2/fic210/sp" },
        Op = new SignalOptions { Tag = "u2/fic210/op" },
        Mode = mode ? new SignalOptions { Tag = "u2/fic210/mode" } : null,
        Tuning = ti is null && kc is null ? null : new TuningOptions { Kc = kc, TiSeconds = ti },
    };

    /// <summary>Checks options into a spec, failing the test on any error.</summary>
    public static LoopSpec Check(LoopOptions options) => LoopRig.Check(options);
}

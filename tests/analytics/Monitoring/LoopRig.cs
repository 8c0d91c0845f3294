using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Monitoring;

/// <summary>One loop of the fictional plant fed through a real <see cref="LoopMonitor"/> in event time, recording every finding change.</summary>
internal sealed class LoopRig
{
    /// <summary>Event time zero of every run.</summary>
    public static readonly long T0 = new DateTime(2026, 4, 6, 5, 0, 0, DateTimeKind.Utc).Ticks;

    /// <summary>A rig with the loop's standard detectors, or with <paramref name="detectors"/> when given (to read their state).</summary>
    public LoopRig(LoopSpec spec, params LoopDetector[] detectors) : this(spec, T0, detectors) { }

    /// <summary>A rig whose event time starts at <paramref name="t0"/> (UTC ticks).</summary>
    public LoopRig(LoopSpec spec, long t0, LoopDetector[] detectors)
    {
        Spec = spec;
        Start = t0;
        Monitor = new LoopMonitor(spec, Changes.Add, detectors.Length == 0 ? null : detectors);
    }

    /// <summary>Event time zero of this rig.</summary>
    public long Start { get; }

    public LoopSpec Spec { get; }
    public LoopMonitor Monitor { get; }
    public List<FindingChange> Changes { get; } = [];

    /// <summary>The findings of a kind that were raised.</summary>
    public IEnumerable<Finding> Raised(string kind) =>
        Changes.Where(c => c.Change == FindingChangeKind.Raised && c.Finding.Kind == kind).Select(c => c.Finding);

    /// <summary>The findings of a kind that were ended.</summary>
    public IEnumerable<Finding> Ended(string kind) =>
        Changes.Where(c => c.Change == FindingChangeKind.Ended && c.Finding.Kind == kind).Select(c => c.Finding);

    /// <summary>Every raise of the given kinds.</summary>
    public IEnumerable<Finding> RaisedAny(params string[] kinds) =>
        Changes.Where(c => c.Change == FindingChangeKind.Raised && kinds.Contains(c.Finding.Kind)).Select(c => c.Finding);

    /// <summary>Feeds one sampling instant at <paramref name="seconds"/> after T0: PV and SP in engineering units, OP in %.</summary>
    public void Feed(double seconds, double pv, double sp, double op, LoopMode? mode = null, double position = double.NaN,
        SampleQuality pvQuality = SampleQuality.Good)
    {
        var ticks = Start + (long)Math.Round(seconds * TimeSpan.TicksPerSecond);
        if (mode is { } m) Monitor.Update(Signal.Mode, ticks, (double)(byte)m);
        if (!double.IsNaN(position)) Monitor.Update(Signal.Position, ticks, position);
        Monitor.Update(Signal.Pv, ticks, pv, pvQuality);
        if (Spec.SpTag is not null) Monitor.Update(Signal.Sp, ticks, sp);
        Monitor.Update(Signal.Op, ticks, op);
    }

    /// <summary>A checked loop spec; PV range <paramref name="min"/>..<paramref name="max"/>.</summary>
    public static LoopSpec Define(string kind, string process, double min = 0, double max = 100, bool mode = false, bool position = false,
        LimitOptions? limits = null)
    {
        var options = new LoopOptions
        {
            Id = kind == "on-off" ? "LS-310" : "FIC-120",
            Description = kind == "on-off" ? "Wet well W-3 pump P-31" : "Cooling water to E-12",
            Area = "unit-3",
            Kind = kind,
            Process = process,
            Pv = new SignalOptions { Tag = "u3/loop/pv", Min = min, Max = max, Unit = process == "level" ? "m" : "" },
            Sp = kind == "pid" ? new SignalOptions { Tag = "u3/loop/sp" } : null,
            Op = new SignalOptions { Tag = "u3/loop/op" },
            Mode = mode ? new SignalOptions { Tag = "u3/loop/mode" } : null,
            Position = position ? new SignalOptions { Tag = "u3/loop/pos" } : null,
            Limits = limits,
        };
        return Check(options);
    }

    /// <summary>Checks options into a spec, failing the test on any error.</summary>
    public static LoopSpec Check(LoopOptions options)
    {
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check([options], errors);
        Assert.Empty(errors);
        return specs.Single();
    }

    /// <summary>Ticks of <paramref name="seconds"/> after T0.</summary>
    public static long At(double seconds) => T0 + (long)Math.Round(seconds * TimeSpan.TicksPerSecond);
}

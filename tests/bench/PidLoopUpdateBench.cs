using BenchmarkDotNet.Attributes;
using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Bench;

/// <summary>
/// LoopMonitor.Update for the PV, SP and OP tags of one pid loop at 1 s through every pid detector, per tag update;
/// target at most 100 ns amortised and 0 B. <see cref="Construct"/> shows the bytes of state one loop holds.
/// </summary>
[MemoryDiagnoser]
public class PidLoopUpdateBench
{
    private const int Samples = 4096;
    private static readonly long T0 = new DateTime(2026, 3, 2, 0, 0, 0, DateTimeKind.Utc).Ticks;

    private LoopSpec _spec = null!;
    private LoopMonitor _monitor = null!;
    private (double Pv, double Sp, double Op)[] _trace = null!;
    private long _second;

    /// <summary>
    /// healthy: a PI loop with filtered noise; sticky: a stick-slip limit cycle with an active oscillation finding;
    /// harris: the healthy loop with Tuning:DeadTimeSeconds, so the performance adviser keeps its 30 min window and refits
    /// it every 5 min of event time (about 14 fits in each measured pass of 4096 samples).
    /// </summary>
    [Params("healthy", "sticky", "harris")]
    public string Scenario { get; set; } = "healthy";

    [GlobalSetup]
    public void Setup()
    {
        var options = new LoopOptions
        {
            Id = "FIC-210", Kind = "pid", Process = "flow",
            Pv = new SignalOptions { Tag = "u2/fic210/pv", Min = 0, Max = 250, Unit = "m3/h" },
            Sp = new SignalOptions { Tag = "u2/fic210/sp" },
            Op = new SignalOptions { Tag = "u2/fic210/op" },
            Tuning = new TuningOptions { Kc = 0.5, TiSeconds = 8, DeadTimeSeconds = Scenario == "harris" ? 2 : null },
        };
        var errors = new List<string>();
        _spec = LoopOptionsCheck.Check([options], errors).Single();
        var setup = Scenario == "sticky"
            ? new PidLoopSetup { Kc = 0.5, TiSeconds = 8, TauSeconds = 5, StictionS = 4, StictionJ = 2, LoadSteps = [(60, 3)] }
            : new PidLoopSetup { Kc = 0.5, TiSeconds = 8, TauSeconds = 5, NoiseSigmaPct = 0.5, NoiseFilterSeconds = 5, Seed = 3 };
        var loop = new PidLoopModel(options, setup);
        _trace = new (double, double, double)[Samples];
        for (var t = 0; t < Samples; t++)
        {
            loop.Step(t, 1);
            var r = loop.Reading;
            _trace[t] = (r.Pv, r.Sp, r.Op);
        }
        _monitor = new LoopMonitor(_spec);
        // Fill the windows first so the measured updates are the steady state.
        UpdatePidTags();
    }

    [Benchmark(OperationsPerInvoke = Samples * 3)]
    public void UpdatePidTags()
    {
        var monitor = _monitor;
        var trace = _trace;
        for (var i = 0; i < trace.Length; i++)
        {
            var ticks = T0 + _second++ * TimeSpan.TicksPerSecond;
            monitor.Update(Signal.Pv, ticks, trace[i].Pv);
            monitor.Update(Signal.Sp, ticks, trace[i].Sp);
            monitor.Update(Signal.Op, ticks, trace[i].Op);
        }
    }

    [Benchmark]
    public LoopMonitor Construct() => new(_spec);
}

using BenchmarkDotNet.Attributes;
using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Bench;

/// <summary>
/// LoopMonitor.Update for the PV and OP tags of one on-off wet well at 1 s through every on-off detector, per tag update;
/// target at most 100 ns amortised and 0 B. The fast sump short-cycles, so an active finding is carried.
/// </summary>
[MemoryDiagnoser]
public class OnOffLoopUpdateBench
{
    private const int Samples = 4096;
    private static readonly long T0 = new DateTime(2026, 4, 6, 0, 0, 0, DateTimeKind.Utc).Ticks;

    private LoopSpec _spec = null!;
    private LoopMonitor _monitor = null!;
    private (double Pv, double Op)[] _trace = null!;
    private long _second;

    [GlobalSetup]
    public void Setup()
    {
        var options = new LoopOptions
        {
            Id = "LS-310", Kind = "on-off", Process = "level",
            Pv = new SignalOptions { Tag = "u3/ls310/pv", Min = 0, Max = 3, Unit = "m" },
            Op = new SignalOptions { Tag = "u3/ls310/op" },
        };
        var errors = new List<string>();
        _spec = LoopOptionsCheck.Check([options], errors).Single();
        var sump = new SumpModel(options, area: 10, depth: 3, stopLevel: 0.5, startLevel: 0.7, pumpRate: 0.05, inflow: 0.025, noiseSigma: 0.002);
        _trace = new (double, double)[Samples];
        for (var t = 0; t < Samples; t++)
        {
            sump.Step(t, 1);
            _trace[t] = (sump.Reading.Pv, sump.Reading.Op);
        }
        _monitor = new LoopMonitor(_spec);
        // Fill the history first so the measured updates are the steady state.
        UpdateOnOffTags();
    }

    [Benchmark(OperationsPerInvoke = Samples * 2)]
    public void UpdateOnOffTags()
    {
        var monitor = _monitor;
        var trace = _trace;
        for (var i = 0; i < trace.Length; i++)
        {
            var ticks = T0 + _second++ * TimeSpan.TicksPerSecond;
            monitor.Update(Signal.Pv, ticks, trace[i].Pv);
            monitor.Update(Signal.Op, ticks, trace[i].Op);
        }
    }

    [Benchmark]
    public LoopMonitor Construct() => new(_spec);
}

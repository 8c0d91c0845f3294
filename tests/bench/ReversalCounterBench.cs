using BenchmarkDotNet.Attributes;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Bench;

/// <summary>
/// One ReversalCounter step (deadband filter, minute buckets, rainflow) per sample, and the pid loop's own detector
/// family (out-of-range, frozen, reversals with position, saturation) per aligned sample; target at most 100 ns and 0 B.
/// </summary>
[MemoryDiagnoser]
public class ReversalCounterBench
{
    private const int Samples = 4096;
    private static readonly long T0 = new DateTime(2026, 4, 6, 0, 0, 0, DateTimeKind.Utc).Ticks;

    private ReversalCounter _counter = null!;
    private LoopDetector[] _detectors = null!;
    private FindingBoard _board = null!;
    private double[] _op = null!;
    private long _second;

    [GlobalSetup]
    public void Setup()
    {
        var options = new LoopOptions
        {
            Id = "FIC-120", Kind = "pid", Process = "flow",
            Pv = new SignalOptions { Tag = "u3/fic120/pv", Min = 0, Max = 250 },
            Sp = new SignalOptions { Tag = "u3/fic120/sp" },
            Op = new SignalOptions { Tag = "u3/fic120/op" },
            Position = new SignalOptions { Tag = "u3/fic120/pos" },
        };
        var errors = new List<string>();
        var spec = LoopOptionsCheck.Check([options], errors).Single();
        _detectors = DetectorSet.For(spec).ToArray();
        _board = new FindingBoard(spec.Id, null);
        _counter = new ReversalCounter(0.5);
        // A hunting output: a 20 s swing of 3 % with noise, reversing a few hundred times an hour.
        var random = new Random(5);
        _op = new double[Samples];
        for (var i = 0; i < Samples; i++) _op[i] = 50 + 3 * Math.Sin(i * Math.PI / 10) + 0.3 * (random.NextDouble() - 0.5);
        CounterStep();
        DetectorsStep();
    }

    [Benchmark(OperationsPerInvoke = Samples)]
    public void CounterStep()
    {
        var c = _counter;
        var op = _op;
        for (var i = 0; i < op.Length; i++) c.Step(T0 + _second++ * TimeSpan.TicksPerSecond, op[i]);
    }

    [Benchmark(OperationsPerInvoke = Samples)]
    public void DetectorsStep()
    {
        var op = _op;
        var detectors = _detectors;
        for (var i = 0; i < op.Length; i++)
        {
            var sample = new AlignedSample(T0 + _second++ * TimeSpan.TicksPerSecond, 120 + op[i] * 0.1, 125, op[i], op[i], LoopMode.Auto, true);
            foreach (var d in detectors) d.Step(sample, _board);
        }
    }
}

using System.Diagnostics;
using System.Globalization;
using BenchmarkDotNet.Attributes;
using LoopWatch.Agent.Analyze;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Bench;

/// <summary>
/// <c>loopwatch analyze</c> end to end on a generated long-format file of <see cref="Rows"/> rows (eight pid loops,
/// PV/SP/OP at 1 s): parse, analytics, alarms and the JSON report. Target at least 2 million rows/s on one core and a
/// peak working set below 200 MB; the peak is printed at cleanup.
/// </summary>
[MemoryDiagnoser]
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
public class AnalyzeBench
{
    private const int Loops = 8;
    private string _file = "";
    private IReadOnlyList<LoopSpec> _specs = [];

    [Params(1_000_000)]
    public int Rows { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        var options = Enumerable.Range(1, Loops).Select(i => new LoopOptions
        {
            Id = $"FIC-{800 + i}", Kind = "pid", Process = "flow",
            Pv = new SignalOptions { Tag = $"bench/FIC-{800 + i}/pv", Min = 0, Max = 100, Unit = "m3/h" },
            Sp = new SignalOptions { Tag = $"bench/FIC-{800 + i}/sp" },
            Op = new SignalOptions { Tag = $"bench/FIC-{800 + i}/op" },
        }).ToList();
        var errors = new List<string>();
        _specs = LoopOptionsCheck.Check(options, errors);
        _file = Path.Combine(Path.GetTempPath(), $"lw-analyze-bench-{Rows}.csv");
        if (File.Exists(_file)) return;
        using var w = new StreamWriter(_file);
        w.Write("timestamp,tag,value\n");
        var start = new DateTimeOffset(2026, 3, 2, 0, 0, 0, TimeSpan.Zero);
        var rng = new Random(5);
        for (var n = 0; n < Rows;)
        {
            var second = n / (Loops * 3);
            var at = start.AddSeconds(second).UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ss.fffZ", CultureInfo.InvariantCulture);
            for (var i = 1; i <= Loops && n < Rows; i++)
            {
                var pv = 50 + 5 * Math.Sin(second / (20.0 + i)) + rng.NextDouble() - 0.5;
                var op = 40 + 10 * Math.Sin(second / (20.0 + i) + 1) + rng.NextDouble();
                w.Write(string.Create(CultureInfo.InvariantCulture, $"{at},bench/FIC-{800 + i}/pv,{pv:0.####}\n")); n++;
                w.Write(string.Create(CultureInfo.InvariantCulture, $"{at},bench/FIC-{800 + i}/sp,50\n")); n++;
                w.Write(string.Create(CultureInfo.InvariantCulture, $"{at},bench/FIC-{800 + i}/op,{op:0.###}\n")); n++;
            }
        }
    }

    [Benchmark]
    public long Analyze()
    {
        var result = new OfflineAnalysis(_specs).Run([_file]);
        JsonReport.Write(result, Stream.Null);
        return result.Values;
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        using var self = Process.GetCurrentProcess();
        Console.WriteLine($"// AnalyzeBench rows={Rows} peak working set {self.PeakWorkingSet64 / (1024 * 1024)} MB");
    }
}

using System.Text;
using BenchmarkDotNet.Attributes;
using Google.Protobuf;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Sparkplug;
using LoopWatch.Agent.Sparkplug.Wire;
using LoopWatch.Analytics.Configuration;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopWatch.Bench;

/// <summary>
/// One message carrying a pid loop's PV, SP and OP: a Sparkplug DDATA with the three metrics by alias through
/// <see cref="SparkplugReader.Ingest"/>, against the same three values as plain topics through <see cref="PlantState.Ingest"/>.
/// Neither carries a timestamp, so both take the receive time and the loop's sampling work is the same.
/// </summary>
[MemoryDiagnoser]
public class SparkplugIngestBench
{
    private const int Messages = 256;
    private PlantState _sparkplugPlant = null!, _plainPlant = null!;
    private SparkplugReader _reader = null!;
    private byte[][] _ddata = null!;
    private byte[][] _plain = null!;

    [GlobalSetup]
    public void Setup()
    {
        _sparkplugPlant = Plant("spBv1.0/Quillmoor/Intake/Skid1:FIC-501/");
        _plainPlant = Plant("quillmoor/FIC-501/");
        _reader = new SparkplugReader(_sparkplugPlant, new SparkplugOptions(), TimeProvider.System, NullLogger<SparkplugReader>.Instance);
        _reader.Ingest("spBv1.0/Quillmoor/NBIRTH/Intake", new Payload { Seq = 0, Metrics = { Metric("bdSeq", 0, 0) } }.ToByteArray());
        _reader.Ingest("spBv1.0/Quillmoor/DBIRTH/Intake/Skid1", new Payload
        {
            Seq = 1, Metrics = { Metric("FIC-501/PV", 1, 50), Metric("FIC-501/SP", 2, 50), Metric("FIC-501/OP", 3, 40) },
        }.ToByteArray());
        // 256 messages continue the sequence from the DBIRTH and wrap back onto it, so the loop over them never shows a gap.
        _ddata = new byte[Messages][];
        for (var i = 0; i < Messages; i++)
            _ddata[i] = new Payload
            {
                Seq = (ulong)((i + 2) % 256),
                Metrics =
                {
                    new Payload.Types.Metric { Alias = 1, DoubleValue = 50 + i % 7 },
                    new Payload.Types.Metric { Alias = 2, DoubleValue = 50 },
                    new Payload.Types.Metric { Alias = 3, DoubleValue = 40 + i % 5 },
                },
            }.ToByteArray();
        _plain = [.. Enumerable.Range(0, Messages).Select(i => Encoding.ASCII.GetBytes((50 + i % 7).ToString()))];
    }

    [Benchmark(OperationsPerInvoke = Messages, Description = "Sparkplug DDATA, 3 metrics by alias")]
    public void Sparkplug()
    {
        for (var i = 0; i < Messages; i++) _reader.Ingest("spBv1.0/Quillmoor/DDATA/Intake/Skid1", _ddata[i]);
    }

    [Benchmark(Baseline = true, OperationsPerInvoke = Messages, Description = "plain topics, 3 messages")]
    public void Plain()
    {
        for (var i = 0; i < Messages; i++)
        {
            _plainPlant.Ingest("quillmoor/FIC-501/PV", _plain[i]);
            _plainPlant.Ingest("quillmoor/FIC-501/SP", "50"u8);
            _plainPlant.Ingest("quillmoor/FIC-501/OP", "40"u8);
        }
    }

    [GlobalCleanup]
    public void Check()
    {
        // A gap or unknown alias would mean the benchmark measured the error path.
        var c = _reader.Counters();
        if (c.SequenceGaps != 0 || c.UnknownAliases != 0) throw new InvalidOperationException($"Sparkplug bench out of step: {c}");
    }

    private static Payload.Types.Metric Metric(string name, ulong alias, double value) =>
        new() { Name = name, Alias = alias, Datatype = (uint)DataType.Double, DoubleValue = value };

    private static PlantState Plant(string prefix)
    {
        var options = new LoopOptions
        {
            Id = "FIC-501", Kind = "pid", Process = "flow",
            Pv = new SignalOptions { Tag = prefix + "PV", Min = 0, Max = 250 },
            Sp = new SignalOptions { Tag = prefix + "SP" },
            Op = new SignalOptions { Tag = prefix + "OP" },
        };
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check([options], errors);
        if (errors.Count > 0) throw new InvalidOperationException(string.Join("; ", errors));
        return new PlantState(specs, new PlantClock(TimeProvider.System), TimeProvider.System, NullLogger<PlantState>.Instance);
    }
}

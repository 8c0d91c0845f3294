using System.Globalization;
using System.IO.Compression;
using System.Text;
using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Tests.Analyze;

/// <summary>
/// Values of simulated loops as a plant gateway sends them (the demo publisher's order and rounding: pv, sp, op, mode,
/// zt; on-off outputs 0/1; mode as text), written by the test as long, wide or gzipped CSV, or kept for MQTT.
/// </summary>
public sealed class PlantRecording
{
    public static readonly DateTimeOffset Start = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);

    public List<(DateTimeOffset At, string Tag, string Value)> Values { get; } = [];
    public List<LoopOptions> Loops { get; } = [];
    public List<string> Tags { get; } = [];

    /// <summary>Steps <paramref name="loops"/> for <paramref name="seconds"/> s in steps of 1/<paramref name="substeps"/> s and records every <paramref name="every"/>-th second.</summary>
    public static PlantRecording Of(IReadOnlyList<SimulatedLoop> loops, int seconds, int every = 1, int substeps = 1)
    {
        var rec = new PlantRecording();
        foreach (var l in loops)
        {
            rec.Loops.Add(l.Options);
            rec.Tags.Add(l.Options.Pv!.Tag!);
            if (l.Options.Sp?.Tag is { } sp) rec.Tags.Add(sp);
            rec.Tags.Add(l.Options.Op!.Tag!);
            if (l.Options.Mode?.Tag is { } m) rec.Tags.Add(m);
            if (l.Options.Position?.Tag is { } z) rec.Tags.Add(z);
        }
        for (var t = 0; t < seconds; t++)
        {
            for (var k = 0; k < substeps; k++)
                foreach (var l in loops) l.Step(t + (double)k / substeps, 1.0 / substeps);
            if ((t + 1) % every != 0) continue;
            var at = Start.AddSeconds(t + 1);
            foreach (var l in loops)
            {
                var r = l.Reading;
                var o = l.Options;
                rec.Values.Add((at, o.Pv!.Tag!, N(r.Pv)));
                if (o.Sp?.Tag is { } sp) rec.Values.Add((at, sp, N(r.Sp)));
                rec.Values.Add((at, o.Op!.Tag!, o.Kind == "on-off" ? (r.Op > 50 ? "1" : "0") : N(r.Op)));
                if (o.Mode?.Tag is { } mode) rec.Values.Add((at, mode, r.Mode == Analytics.Sampling.LoopMode.Manual ? "manual" : "auto"));
                if (o.Position?.Tag is { } zt) rec.Values.Add((at, zt, N(r.Position)));
            }
        }
        return rec;
    }

    /// <summary>The demo publisher's rounding.</summary>
    public static string N(double v) => Math.Round(v, 4).ToString("R", CultureInfo.InvariantCulture);

    public static string Stamp(DateTimeOffset t) => t.UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ss.fffZ", CultureInfo.InvariantCulture);

    public string LongCsv()
    {
        var sb = new StringBuilder("timestamp,tag,value\n");
        foreach (var (at, tag, value) in Values) sb.Append(Stamp(at)).Append(',').Append(tag).Append(',').Append(value).Append('\n');
        return sb.ToString();
    }

    public string WideCsv()
    {
        var sb = new StringBuilder("timestamp,").Append(string.Join(',', Tags)).Append('\n');
        var index = Tags.Select((t, i) => (t, i)).ToDictionary(x => x.t, x => x.i);
        var row = new string[Tags.Count];
        for (var i = 0; i < Values.Count;)
        {
            var at = Values[i].At;
            Array.Fill(row, "");
            for (; i < Values.Count && Values[i].At == at; i++) row[index[Values[i].Tag]] = Values[i].Value;
            sb.Append(Stamp(at)).Append(',').Append(string.Join(',', row)).Append('\n');
        }
        return sb.ToString();
    }

    public static void WriteGz(string path, string text)
    {
        using var file = File.Create(path);
        using var gz = new GZipStream(file, CompressionLevel.Fastest);
        gz.Write(Encoding.UTF8.GetBytes(text));
    }

    /// <summary>The configuration file of the recorded loops.</summary>
    public string ConfigJson(Func<LoopOptions, object>? limits = null) => ConfigFor(Loops, limits);

    public static string ConfigFor(IEnumerable<LoopOptions> loops, Func<LoopOptions, object>? limits = null)
    {
        var list = loops.Select(l => new Dictionary<string, object?>
        {
            ["Id"] = l.Id, ["Description"] = l.Description, ["Area"] = l.Area, ["Kind"] = l.Kind, ["Process"] = l.Process,
            ["Pv"] = l.Pv, ["Sp"] = l.Sp, ["Op"] = l.Op, ["Mode"] = l.Mode, ["Position"] = l.Position, ["Tuning"] = l.Tuning,
            ["Limits"] = limits?.Invoke(l) ?? l.Limits,
        }.Where(kv => kv.Value is not null).ToDictionary()).ToList();
        return System.Text.Json.JsonSerializer.Serialize(new { LoopWatch = new { Loops = list } },
            new System.Text.Json.JsonSerializerOptions { DefaultIgnoreCondition = System.Text.Json.Serialization.JsonIgnoreCondition.WhenWritingNull, WriteIndented = true });
    }
}

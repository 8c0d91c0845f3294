using System.Text.Json;

namespace LoopWatch.Agent.Bench;

/// <summary>The figures of one bench run; null where the mode does not measure a figure.</summary>
public sealed record BenchResult(
    string Mode,
    int Loops,
    long Offered,
    long Processed,
    double OfferedPerS,
    double ProcessedPerS,
    double? BaselinePerS,
    double? Ratio,
    long Lost,
    long Duplicates,
    double? P99LatencyMs,
    double? P50LatencyMs,
    double CpuCores,
    double RssMb,
    double BytesPerLoop,
    double CpuMicrosPerUpdate,
    double? AllocatedBytesPerUpdate = null)
{
    /// <summary>The final line: one JSON object with the keys the issue fixes, in that order.</summary>
    public string JsonLine()
    {
        using var buffer = new MemoryStream();
        using (var w = new Utf8JsonWriter(buffer))
        {
            w.WriteStartObject();
            w.WriteNumber("loops", Loops);
            w.WriteNumber("tags", Loops * BenchOptions.TagsPerLoop);
            w.WriteNumber("offered_per_s", Math.Round(OfferedPerS, 1));
            w.WriteNumber("processed_per_s", Math.Round(ProcessedPerS, 1));
            Number(w, "baseline_per_s", BaselinePerS, 1);
            Number(w, "ratio", Ratio, 3);
            w.WriteNumber("lost", Lost);
            Number(w, "p99_latency_ms", P99LatencyMs, 2);
            w.WriteNumber("cpu_cores", Math.Round(CpuCores, 3));
            w.WriteNumber("rss_mb", Math.Round(RssMb, 1));
            w.WriteNumber("bytes_per_loop", Math.Round(BytesPerLoop));
            w.WriteEndObject();
        }
        return System.Text.Encoding.UTF8.GetString(buffer.ToArray());
    }

    /// <summary>The human table printed before the JSON line.</summary>
    public void WriteTable(TextWriter o, string load)
    {
        static string F(double? v, string format) => v is { } x ? x.ToString(format, System.Globalization.CultureInfo.InvariantCulture) : "-";
        o.WriteLine($"LoopWatch bench ({Mode})");
        o.WriteLine($"  {"loops x tags",-30} {Loops:N0} x {BenchOptions.TagsPerLoop}");
        o.WriteLine($"  {"updates offered / processed",-30} {Offered} / {Processed}");
        o.WriteLine($"  {"offered updates/s",-30} {F(OfferedPerS, "N0")}");
        o.WriteLine($"  {"processed updates/s",-30} {F(ProcessedPerS, "N0")}");
        o.WriteLine($"  {"bare subscriber updates/s",-30} {F(BaselinePerS, "N0")}");
        o.WriteLine($"  {"ratio processed/bare",-30} {F(Ratio, "0.000")}");
        o.WriteLine($"  {"lost / doubled",-30} {Lost:N0} / {Duplicates:N0}");
        o.WriteLine($"  {"p50 / p99 publish->processed",-30} {F(P50LatencyMs, "0.00")} / {F(P99LatencyMs, "0.00")} ms");
        o.WriteLine($"  {"CPU (cores, whole process)",-30} {F(CpuCores, "0.000")}");
        o.WriteLine($"  {"CPU per update (us, process)",-30} {F(CpuMicrosPerUpdate, "0.000")}");
        o.WriteLine($"  {"allocated per update (B, process)",-30} {F(AllocatedBytesPerUpdate, "N1")}");
        o.WriteLine($"  {"peak RSS (MB, whole process)",-30} {F(RssMb, "0.0")}");
        o.WriteLine($"  {"managed bytes per loop",-30} {F(BytesPerLoop, "N0")}");
        o.WriteLine($"  {"load average (1, 5, 15 min)",-30} {load}");
    }

    private static void Number(Utf8JsonWriter w, string name, double? value, int digits)
    {
        if (value is { } v && double.IsFinite(v)) w.WriteNumber(name, Math.Round(v, digits));
        else w.WriteNull(name);
    }
}

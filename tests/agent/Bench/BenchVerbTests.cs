using System.Text.Json;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Bench;

/// <summary>
/// The bench verb end to end with a small plant: the JSON line parses with the fixed keys and every update offered
/// reaches the agent's ingest path exactly once. No speed is asserted here; figures come from running the verb.
/// </summary>
public sealed class BenchVerbTests
{
    private static readonly string[] Keys =
        ["loops", "tags", "offered_per_s", "processed_per_s", "baseline_per_s", "ratio", "lost", "p99_latency_ms", "cpu_cores", "rss_mb", "bytes_per_loop"];

    [Fact]
    public async Task Fixed_rate_on_the_embedded_broker_loses_nothing_and_processes_every_update_offered()
    {
        var (json, offered, processed) = await LosslessBenchAsync("--loops", "200", "--rate", "3000", "--seconds", "3");
        Assert.Equal(200, json.GetProperty("loops").GetInt32());
        Assert.Equal(600, json.GetProperty("tags").GetInt32());
        Assert.True(offered > 0);
        Assert.Equal(offered, processed);
        Assert.Equal(JsonValueKind.Null, json.GetProperty("baseline_per_s").ValueKind); // the bare subscriber runs only flat out
        Assert.Equal(JsonValueKind.Number, json.GetProperty("p99_latency_ms").ValueKind);
        Assert.True(json.GetProperty("rss_mb").GetDouble() > 0);
    }

    [Fact]
    public async Task Flat_out_measures_the_bare_subscriber_and_the_agent_on_the_same_stream()
    {
        var (json, offered, processed) = await LosslessBenchAsync("--loops", "200", "--seconds", "2");
        Assert.Equal(offered, processed);
        var baseline = json.GetProperty("baseline_per_s").GetDouble();
        Assert.True(baseline > 0);
        // The ratio is taken before rounding; the two rates are printed to one decimal, so allow their relative rounding too.
        var fromRates = json.GetProperty("processed_per_s").GetDouble() / baseline;
        Assert.Equal(fromRates, json.GetProperty("ratio").GetDouble(), 0.0005 + 0.05 * (1 + fromRates) / baseline + 1e-9);
    }

    [Fact]
    public async Task An_external_mosquitto_carries_the_stream_to_the_agent_without_loss()
    {
        await using var broker = await Mosquitto.StartAsync();
        var (json, offered, processed) = await LosslessBenchAsync("--loops", "200", "--rate", "3000", "--seconds", "3", "--broker", $"127.0.0.1:{broker.Port}");
        Assert.True(offered > 0);
        Assert.Equal(offered, processed);
    }

    [Fact]
    public async Task In_process_mode_feeds_the_analytics_without_mqtt()
    {
        var (json, offered, processed) = await BenchAsync("--in-process", "--loops", "200", "--seconds", "1");
        Assert.Equal(offered, processed);
        Assert.True(offered >= 2 * 600); // at least the two warm-up rounds of every tag ran through
        Assert.True(json.GetProperty("processed_per_s").GetDouble() > 0);
        Assert.Equal(JsonValueKind.Null, json.GetProperty("p99_latency_ms").ValueKind);
    }

    [Fact]
    public async Task A_bad_option_is_a_usage_error()
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        Assert.Equal(2, await Cli.RunAsync(["bench", "--in-process", "--rate", "100"], stdout, stderr));
        Assert.Contains("--in-process", stderr.ToString());
        Assert.Equal(2, await Cli.RunAsync(["bench", "--broker", "nowhere"], stdout, stderr));
        Assert.Contains("--broker", stderr.ToString());
    }

    private static async Task<(JsonElement Json, long Offered, long Processed)> BenchAsync(params string[] args)
    {
        var (json, offered, processed, _) = await BenchWithProgressAsync(args);
        return (json, offered, processed);
    }

    /// <summary>
    /// A run that must lose nothing. QoS 0 messages on their way are lost by the protocol when a connection drops (a
    /// keep-alive timeout on a stalled machine): a loss the run itself explains by a reconnect or a lost client is
    /// repeated once; any other loss, or a second one, fails with the progress lines.
    /// </summary>
    private static async Task<(JsonElement Json, long Offered, long Processed)> LosslessBenchAsync(params string[] args)
    {
        var (json, offered, processed, progress) = await BenchWithProgressAsync(args);
        if (json.GetProperty("lost").GetInt64() > 0 && ConnectionDropped(progress))
            (json, offered, processed, progress) = await BenchWithProgressAsync(args);
        Assert.True(json.GetProperty("lost").GetInt64() == 0, $"lost {json.GetProperty("lost")}:\n{progress}");
        return (json, offered, processed);
    }

    private static bool ConnectionDropped(string progress) =>
        System.Text.RegularExpressions.Regex.Matches(progress, @"(?:reconnects|clients lost) (\d+)").Any(m => long.Parse(m.Groups[1].Value) > 0);

    // The progress lines (stderr) carry the agent's ingest counters and reconnects; a failed check shows them.
    private static async Task<(JsonElement Json, long Offered, long Processed, string Progress)> BenchWithProgressAsync(params string[] args)
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        var code = await Cli.RunAsync(["bench", .. args], stdout, stderr);
        Assert.True(code == 0, $"exit {code}: {stderr}");
        var lines = stdout.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        using var doc = JsonDocument.Parse(lines[^1]);
        var json = doc.RootElement.Clone();
        Assert.Equal(Keys, json.EnumerateObject().Select(p => p.Name).ToArray());
        var counts = lines.Single(l => l.StartsWith("updates offered / processed", StringComparison.Ordinal))
            .Split(' ', StringSplitOptions.RemoveEmptyEntries)[^3..];
        return (json, long.Parse(counts[0]), long.Parse(counts[2]), stderr.ToString());
    }
}

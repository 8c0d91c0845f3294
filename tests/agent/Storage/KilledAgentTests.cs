using System.Diagnostics;
using System.Net.Http.Json;
using System.Text.Json;
using Dapper;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Storage;
using MQTTnet;
using Xunit.Abstractions;

namespace LoopWatch.Agent.Tests.Storage;

public sealed class KilledAgentTests(ITestOutputHelper output)
{
    [Fact]
    public async Task After_sigkill_the_journal_holds_every_transition_older_than_one_second()
    {
        await using var broker = await Mosquitto.StartAsync();
        var dir = Directory.CreateTempSubdirectory("lw-kill-").FullName;
        var http = FreePort.Next();
        const int loops = 20;
        var loopJson = string.Join(",", Enumerable.Range(0, loops).Select(i => $$"""
            { "Id": "FIC-{{i:000}}", "Kind": "pid", "Process": "flow",
              "Pv": { "Tag": "kill/{{i}}/pv", "Min": 0, "Max": 200 }, "Sp": { "Tag": "kill/{{i}}/sp" }, "Op": { "Tag": "kill/{{i}}/op" },
              "Limits": { "StaleSeconds": 1 }, "Alarms": { "OnDelaySeconds": 0, "OffDelaySeconds": 0 } }
            """));
        var config = Path.Combine(dir, "plant.json");
        await File.WriteAllTextAsync(config, $$"""
            { "LoopWatch": { "Broker": { "Host": "127.0.0.1", "Port": {{broker.Port}}, "ClientId": "lw-kill" },
              "Dashboard": { "Urls": "http://127.0.0.1:{{http}}" }, "AlarmSystem": { "PublishHealth": false },
              "Loops": [ {{loopJson}} ] } }
            """);
        var dll = Path.Combine(AppContext.BaseDirectory, "loopwatch.dll");
        var psi = new ProcessStartInfo("dotnet", [dll, "run", "--config", config, "--data-dir", Path.Combine(dir, "data")])
        { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        using var agent = Process.Start(psi)!;
        agent.BeginOutputReadLine();
        agent.BeginErrorReadLine();
        using var api = new HttpClient { BaseAddress = new Uri($"http://127.0.0.1:{http}") };
        try
        {
            await Eventually.Until(async () =>
            {
                try { return (await api.GetFromJsonAsync<JsonElement>("/healthz")).GetProperty("ingest").GetProperty("broker_connected").GetBoolean(); }
                catch (HttpRequestException) { return false; }
            }, c => c, TimeSpan.FromSeconds(60), "child agent subscribed");

            using var client = new MqttClientFactory().CreateMqttClient();
            await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", broker.Port).Build());
            var start = DateTimeOffset.UtcNow;
            // Each loop is fed for 2 s then silent for 2 s (offset by loop), so stale alarms raise and return all the time.
            var clock = Stopwatch.StartNew();
            while (clock.Elapsed < TimeSpan.FromSeconds(10))
            {
                var now = DateTimeOffset.UtcNow;
                var ts = now.ToString("O");
                for (var i = 0; i < loops; i++)
                {
                    if (((int)(clock.Elapsed.TotalSeconds * 1) + i) / 2 % 2 == 1) continue;
                    foreach (var tag in new[] { "pv", "sp", "op" })
                        await client.PublishStringAsync($"kill/{i}/{tag}", $$"""{"value": 50, "timestamp": "{{ts}}"}""");
                }
                await Task.Delay(100);
            }
            var reported = await api.GetFromJsonAsync<JsonElement>($"/api/alarms?state=all&since={Uri.EscapeDataString(start.ToString("O"))}");
            agent.Kill(); // SIGKILL on Linux: no shutdown code runs
            var killed = DateTimeOffset.UtcNow;
            await agent.WaitForExitAsync();

            var transitions = reported.GetProperty("transitions").EnumerateArray()
                .Select(t => (Time: t.GetProperty("time").GetDateTimeOffset(), Id: t.GetProperty("id").GetString()!, To: t.GetProperty("to").GetString()!))
                .ToList();
            Assert.True(transitions.Count > 50, $"only {transitions.Count} transitions were made");

            using var db = LoopWatchDatabase.Open(Path.Combine(dir, "data", "loopwatch.db"));
            using var c = db.OpenConnection();
            Assert.Equal("ok", c.ExecuteScalar<string>("PRAGMA integrity_check")); // SQLite docs: "ok" for a sound file
            var stored = c.Query<(long TimeMs, string LoopId, string Kind, string ToState)>(
                "SELECT time_ms, loop_id, kind, to_state FROM alarm_journal").Select(r => (r.TimeMs, $"{r.LoopId}:{r.Kind}", r.ToState)).ToHashSet();
            var missing = transitions.Where(t => !stored.Contains((t.Time.ToUnixTimeMilliseconds(), t.Id, t.To))).ToList();
            var oldestMissing = missing.Count == 0 ? TimeSpan.Zero : killed - missing.Min(m => m.Time);
            output.WriteLine($"{transitions.Count} transitions reported, {stored.Count} stored, {missing.Count} missing; oldest missing {oldestMissing.TotalMilliseconds:0} ms before the kill");
            // Our bound: the writer commits each batch as soon as it is queued, so at most the last second may be lost.
            Assert.All(missing, m => Assert.True(killed - m.Time < TimeSpan.FromSeconds(1), $"{m.Id} {m.To} at {m.Time:O} lost, {(killed - m.Time).TotalMilliseconds:0} ms before the kill"));
        }
        finally
        {
            if (!agent.HasExited) agent.Kill();
        }
    }
}

using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Dapper;
using LoopWatch.Agent.Tests.Alarms;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Dashboard.Model;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.DependencyInjection;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Storage;

/// <summary>
/// Loop ids, tags, user names and comments with quotes, SQL fragments, markup and great length, through the real agent:
/// MQTT, the alarm engine, the SQLite writer, a restart, the API and the alarms page.
/// </summary>
public sealed class HostileNamesTests
{
    private const string Id = "FIC-'; DROP TABLE alarm_journal; --<b>x</b>\"";
    private static readonly string Root = "q'\"<i>/\"); DELETE FROM alarm_state; --";
    private static readonly string User = "o'brien\"; DROP TABLE users; --<script>alert(1)</script>" + new string('u', 2000);
    private static readonly string Comment = "'; DROP TABLE alarm_journal; --\n<b>valve</b> & \"stuck\" Δp ≥ 2 bar " + string.Concat(Enumerable.Repeat("'\"; -- ", 1500));

    private static LoopOptions Loop()
    {
        var o = TestLoops.Pid(Id, Root);
        o.Description = "<img src=x onerror=alert(2)> '; DROP TABLE hourly_stats; --";
        o.Limits = new LimitOptions { StaleSeconds = 2 };
        o.Alarms = new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 };
        return o;
    }

    [Fact]
    public async Task Hostile_names_and_comments_are_stored_restored_and_shown_intact_and_no_sql_in_them_runs()
    {
        var dir = Directory.CreateTempSubdirectory("lw-hostile-").FullName;
        var port = FreePort.Next();
        var alarmId = Id + ":stale";
        await using (var agent = await RunningAgent.StartAsync([Loop()], embedded: true, brokerPort: port, dataDir: dir,
            services: s => s.AddSingleton<IActionGuard, HeaderGuard>()))
        {
            using var client = new MqttClientFactory().CreateMqttClient();
            await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).Build());
            await agent.UntilSubscribedAsync("subscribed");
            var ts = DateTimeOffset.UtcNow.ToString("O");
            foreach (var (tag, v) in new[] { ("pv", 100.0), ("sp", 100.0), ("op", 40.0) })
                await client.PublishStringAsync($"{Root}/{Id}/{tag}", $$"""{"value": {{v}}, "timestamp": "{{ts}}"}""");
            var loop = await Eventually.Until(() => agent.LoopAsync(Id), l => l is { } x && x.GetProperty("pv").ValueKind == JsonValueKind.Number, what: "values under hostile tags");
            Assert.Equal(Loop().Description, loop!.Value.GetProperty("description").GetString());

            await Eventually.Until(async () => await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=active"),
                j => j.GetProperty("alarms").EnumerateArray().Any(a => a.GetProperty("id").GetString() == alarmId), what: "stale alarm on the hostile loop");
            using var ack = new HttpRequestMessage(HttpMethod.Post, $"/api/alarms/{Uri.EscapeDataString(alarmId)}/ack") { Content = JsonContent.Create(new { comment = Comment }) };
            ack.Headers.Add("X-Test-Operator", User);
            var acked = await agent.Http.SendAsync(ack);
            Assert.True(acked.StatusCode == HttpStatusCode.OK, await acked.Content.ReadAsStringAsync());
            var all = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all&since=2000-01-01T00:00:00Z");
            Assert.Contains(all.GetProperty("transitions").EnumerateArray(), t => t.GetProperty("user").GetString() == User && t.GetProperty("comment").GetString() == Comment);
        }

        // Stored intact, every table still there, the file sound (read with parameters, as the agent does).
        await using (var raw = new SqliteConnection($"Data Source={Path.Combine(dir, "loopwatch.db")}"))
        {
            var acked = raw.Query<(string LoopId, string User, string Comment)>(
                "SELECT loop_id AS LoopId, user AS User, comment AS Comment FROM alarm_journal WHERE to_state = @To", new { To = "acknowledged" }).ToList();
            Assert.Equal((Id, User, Comment), Assert.Single(acked));
            var tables = raw.Query<string>("SELECT name FROM sqlite_schema WHERE type = 'table'").ToList();
            Assert.Contains("alarm_journal", tables);
            Assert.Contains("alarm_state", tables);
            Assert.Contains("hourly_stats", tables);
            Assert.Contains("users", tables);
            Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
        }

        // Restored at the next start under the same hostile id, and shown as text on the alarms page.
        await using (var again = await RunningAgent.StartAsync([Loop()], embedded: true, brokerPort: FreePort.Next(), dataDir: dir))
        {
            var alarms = await again.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all");
            var restored = alarms.GetProperty("alarms").EnumerateArray().Single(a => a.GetProperty("id").GetString() == alarmId);
            Assert.Equal(Id, restored.GetProperty("loop_id").GetString());
            Assert.Equal(User, restored.GetProperty("acked_by").GetString());
            var html = await again.Http.GetStringAsync("/alarms");
            Assert.DoesNotContain("<b>valve</b>", html);
            Assert.DoesNotContain("<script>alert(1)</script>", html);
            Assert.DoesNotContain("<b>x</b>", html);
            var text = WebUtility.HtmlDecode(html);
            Assert.Contains(Id, text);
            Assert.Contains(User, text);
        }
    }
}

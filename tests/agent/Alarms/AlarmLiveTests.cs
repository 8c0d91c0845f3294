using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Dashboard.Model;
using Microsoft.Extensions.DependencyInjection;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Alarms;

public sealed class AlarmLiveTests
{
    private static async Task FeedAsync(IMqttClient client, string id, DateTimeOffset t)
    {
        var ts = t.ToString("O");
        foreach (var (tag, v) in new[] { ("pv", 100.0), ("sp", 100.0), ("op", 40.0) })
            await client.PublishStringAsync($"test/{id}/{tag}", $$"""{"value": {{v}}, "timestamp": "{{ts}}"}""");
        await client.PublishStringAsync($"test/{id}/mode", "auto");
    }

    [Fact]
    public async Task A_stale_loop_raises_an_alarm_an_operator_acknowledges_through_the_api()
    {
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync([TestLoops.FastStale("FIC-970")], embedded: true, brokerPort: port,
            services: s => s.AddSingleton<IActionGuard, HeaderGuard>());
        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).Build());
        await agent.UntilSubscribedAsync("subscribed");
        await FeedAsync(client, "FIC-970", DateTimeOffset.UtcNow);

        var active = await Eventually.Until(async () => await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=active"),
            j => j.GetProperty("alarms").EnumerateArray().Any(a => a.GetProperty("id").GetString() == "FIC-970:stale"), what: "stale alarm");
        var stale = active.GetProperty("alarms").EnumerateArray().Single(a => a.GetProperty("id").GetString() == "FIC-970:stale");
        Assert.Equal("unacknowledged", stale.GetProperty("state").GetString());
        Assert.Equal("high", stale.GetProperty("priority").GetString()); // our documented default for stale

        // Without the operator header the default guard path refuses (403); with it the acknowledgement is taken.
        var refused = await agent.Http.PostAsJsonAsync("/api/alarms/FIC-970:stale/ack", new { user = "op.one" });
        Assert.Equal(HttpStatusCode.Forbidden, refused.StatusCode);
        using var ack = new HttpRequestMessage(HttpMethod.Post, "/api/alarms/FIC-970:stale/ack") { Content = JsonContent.Create(new { comment = "gateway restart" }) };
        ack.Headers.Add("X-Test-Operator", "op.one");
        var ok = await agent.Http.SendAsync(ack);
        Assert.Equal(HttpStatusCode.OK, ok.StatusCode);
        var again = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all&since=2000-01-01T00:00:00Z");
        Assert.Contains(again.GetProperty("transitions").EnumerateArray(),
            t => t.GetProperty("to").GetString() == "acknowledged" && t.GetProperty("user").GetString() == "op.one");
        // A second acknowledgement is refused by the state diagram (409), not an error.
        using var twice = new HttpRequestMessage(HttpMethod.Post, "/api/alarms/FIC-970:stale/ack") { Content = JsonContent.Create(new { }) };
        twice.Headers.Add("X-Test-Operator", "op.one");
        Assert.Equal(HttpStatusCode.Conflict, (await agent.Http.SendAsync(twice)).StatusCode);

        var health = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarm-health");
        Assert.True(health.GetProperty("activations").GetInt32() >= 1);
    }

    [Fact]
    public async Task Loop_health_is_retained_on_mosquitto_and_read_by_mosquitto_sub()
    {
        await using var broker = await Mosquitto.StartAsync();
        await using var agent = await RunningAgent.StartAsync([TestLoops.FastStale("FIC-971")], embedded: false, brokerPort: broker.Port,
            tweak: o => o.AlarmSystem.HealthIntervalSeconds = 1);
        // mosquitto_sub is a client we did not write; -C 1 exits after one message, retained ones included.
        var sub = await Eventually.Until(() => broker.SubscribeOneAsync("loopwatch/+/health"),
            o => o.StartsWith("loopwatch/FIC-971/health ", StringComparison.Ordinal), what: "retained health message");
        var json = JsonDocument.Parse(sub["loopwatch/FIC-971/health ".Length..]).RootElement;
        Assert.Equal("FIC-971", json.GetProperty("loop").GetString());
        Assert.True(json.TryGetProperty("alarms", out _));
        Assert.True(json.TryGetProperty("stats", out _));
    }

    [Fact]
    public void A_health_namespace_over_a_loop_tag_is_refused()
    {
        var o = new LoopWatch.Agent.Configuration.AgentOptions();
        o.Loops.Add(TestLoops.Pid("FIC-972"));
        o.AlarmSystem.HealthNamespace = "test/FIC-972";
        var errors = new List<string>();
        LoopWatch.Agent.Configuration.AgentOptionsCheck.Check(o, errors);
        Assert.Contains(errors, e => e.StartsWith("AlarmSystem:HealthNamespace: 'test/FIC-972' overlaps the loop tag", StringComparison.Ordinal));
    }
}

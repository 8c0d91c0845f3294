using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Metrics;

/// <summary>/metrics of a real running agent fed through a real Mosquitto by mosquitto_pub.</summary>
public sealed class MetricsTests
{
    internal static async Task<Dictionary<string, double>> ScrapeAsync(RunningAgent agent)
    {
        var response = await agent.Http.GetAsync("/metrics");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.StartsWith("text/plain", response.Content.Headers.ContentType?.MediaType);
        return PrometheusText.Parse(await response.Content.ReadAsStringAsync());
    }

    [Fact]
    public async Task Counters_equal_what_was_published_alarm_gauges_equal_api_alarms_and_commits_are_timed()
    {
        await using var broker = await Mosquitto.StartAsync();
        await using var agent = await RunningAgent.StartAsync([TestLoops.FastStale("FIC-980"), TestLoops.Pid("FIC-981")], embedded: false, brokerPort: broker.Port);
        await agent.UntilSubscribedAsync();

        var t = DateTimeOffset.UtcNow;
        string At(double seconds) => t.AddSeconds(seconds).ToString("O");
        // Seven good values, one of them late (older than FIC-980's current 1 s interval), and four bad payloads.
        var good = new (string Topic, string Payload)[]
        {
            ("test/FIC-980/pv", $$"""{"value": 100, "timestamp": "{{At(0)}}"}"""),
            ("test/FIC-980/sp", $$"""{"value": 100, "timestamp": "{{At(0)}}"}"""),
            ("test/FIC-980/op", $$"""{"value": 40, "timestamp": "{{At(0)}}"}"""),
            ("test/FIC-980/pv", $$"""{"value": 101, "timestamp": "{{At(5)}}"}"""),
            ("test/FIC-980/pv", $$"""{"value": 99, "timestamp": "{{At(1)}}"}"""), // late
            ("test/FIC-981/pv", "12.5"),
            ("test/FIC-981/mode", "auto"),
        };
        var bad = new (string Topic, string Payload, string Reason)[]
        {
            ("test/FIC-981/pv", "twelve", "not_a_number"),
            ("test/FIC-981/op", "NaN", "not_finite"),
            ("test/FIC-981/sp", "{\"value\": ", "bad_json"),
            ("test/FIC-981/pv", """{"value": 1, "timestamp": "2026-03-02T00:00:01"}""", "bad_timestamp"), // no zone
        };
        foreach (var (topic, payload) in good) await broker.PublishAsync(topic, payload, qos: 1);
        foreach (var (topic, payload, _) in bad) await broker.PublishAsync(topic, payload, qos: 1);
        var sent = good.Length + bad.Length;

        var m = await Eventually.Until(() => ScrapeAsync(agent), s => s.Get("loopwatch_messages_received_total") >= sent, what: "all messages counted");
        Assert.Equal(sent, m.Get("loopwatch_messages_received_total"));
        Assert.Equal(good.Length, m.Get("loopwatch_messages_accepted_total"));
        foreach (var g in bad.GroupBy(b => b.Reason))
            Assert.Equal(g.Count(), m.Get($"loopwatch_messages_rejected_total{{reason=\"{g.Key}\"}}"));
        Assert.Equal(bad.Length, m.Where(kv => kv.Key.StartsWith("loopwatch_messages_rejected_total{", StringComparison.Ordinal)).Sum(kv => kv.Value));
        Assert.Equal(0, m.Get("loopwatch_messages_unknown_topic_total")); // Mosquitto delivers only subscribed topics
        Assert.Equal(1, m.Get("loopwatch_messages_late_total"));
        Assert.Equal(1, m.Get("loopwatch_broker_connected"));
        Assert.DoesNotContain("loopwatch_broker_messages_dropped_total", m.Keys); // an external broker counts its own losses
        Assert.Equal(2, m.Get("loopwatch_loops"));
        // The same figures /healthz reports.
        var ingest = (await agent.HealthAsync()).GetProperty("ingest");
        Assert.Equal(ingest.GetProperty("rejected").GetInt64(), bad.Length);

        // FIC-980 goes stale two seconds after its last value: a high-priority alarm with no on-delay.
        await Eventually.Until(async () => await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=active"),
            j => j.GetProperty("alarms").EnumerateArray().Any(a => a.GetProperty("id").GetString() == "FIC-980:stale"), what: "stale alarm");
        var (scrape, alarms) = await Eventually.Until(async () =>
            {
                // An alarm may move between two reads; take a scrape framed by two equal alarm lists.
                var before = await ActiveByPriorityAsync(agent);
                var s = await ScrapeAsync(agent);
                var after = await ActiveByPriorityAsync(agent);
                return (s, before.SequenceEqual(after) ? before : null);
            }, x => x.Item2 is not null, what: "a stable alarm list");
        foreach (var priority in new[] { "low", "medium", "high" })
            Assert.Equal(alarms!.GetValueOrDefault(priority), scrape.Get($"loopwatch_alarms_active{{priority=\"{priority}\"}}"));
        Assert.True(scrape.Get("loopwatch_alarms_active{priority=\"high\"}") >= 1);
        Assert.True(scrape.Get("loopwatch_loops_by_state{state=\"stale\"}") >= 1);

        // The alarm's journal rows went through the writer: its commits were timed.
        var timed = await Eventually.Until(() => ScrapeAsync(agent), s => s.Get("loopwatch_db_batch_commit_seconds_count") > 0, what: "a timed batch commit");
        Assert.True(timed.Get("loopwatch_db_batch_commit_seconds_sum") > 0);
        Assert.Equal(timed.Get("loopwatch_db_batch_commit_seconds_count"), timed.Get("loopwatch_db_batch_commit_seconds_bucket{le=\"+Inf\"}"));
        Assert.True(timed.Get("loopwatch_db_rows_written_total") > 0);
    }

    private static async Task<SortedDictionary<string, int>> ActiveByPriorityAsync(RunningAgent agent)
    {
        var j = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=active");
        return new SortedDictionary<string, int>(j.GetProperty("alarms").EnumerateArray()
            .GroupBy(a => a.GetProperty("priority").GetString()!).ToDictionary(g => g.Key, g => g.Count()));
    }

    [Theory]
    [InlineData(false, "viewing", HttpStatusCode.OK)]
    [InlineData(true, "viewing", HttpStatusCode.Redirect)]
    [InlineData(true, "open", HttpStatusCode.OK)]
    [InlineData(false, "off", HttpStatusCode.NotFound)]
    public async Task Access_follows_Dashboard_MetricsAccess(bool requireLogin, string access, HttpStatusCode expected)
    {
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-982")], embedded: true, brokerPort: FreePort.Next(),
            tweak: o => { o.Dashboard.RequireLoginToView = requireLogin; o.Dashboard.MetricsAccess = access; });
        using var http = new HttpClient(new HttpClientHandler { AllowAutoRedirect = false }) { BaseAddress = agent.Http.BaseAddress };
        var response = await http.GetAsync("/metrics");
        Assert.Equal(expected, response.StatusCode);
        if (expected == HttpStatusCode.Redirect) Assert.StartsWith("/login", response.Headers.Location?.PathAndQuery);
    }
}

using System.Net.Http.Json;
using System.Text.Json;
using LoopWatch.Agent.Analyze;
using LoopWatch.Agent.Plant;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Dashboard.Api;
using Microsoft.Extensions.Time.Testing;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Analyze;

public sealed class MqttRoundTripTests
{
    [Fact]
    public async Task Values_published_to_the_agent_over_mqtt_and_the_same_values_in_a_csv_file_give_the_same_findings_and_statistics()
    {
        // PIC-201 (proportional-only, offset after the load step at 15 min) and FIC-102 (sticky valve) for 30 simulated minutes.
        var demo = new DemoPlant(seed: 3);
        var loops = demo.Loops.Where(l => l.Options.Id is "PIC-201" or "FIC-102").ToList();
        var rec = PlantRecording.Of(loops, seconds: 1800);

        // A fake clock: the agent's ticker never fires, so only event time speaks, as in the file run. The clock stands
        // at the recording's start, so the recorded timestamps may lead it by the whole half hour.
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync(rec.Loops, embedded: true, brokerPort: port, time: new FakeTimeProvider(PlantRecording.Start),
            tweak: o => o.Broker.MaxLeadSeconds = 3600);
        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId("test-gateway").Build());
        await agent.UntilSubscribedAsync();
        foreach (var (at, tag, value) in rec.Values)
        {
            var payload = value is "auto" or "manual" ? $"\"{value}\"" : value;
            await client.PublishStringAsync(tag, $"{{\"value\":{payload},\"timestamp\":\"{PlantRecording.Stamp(at)}\"}}",
                MQTTnet.Protocol.MqttQualityOfServiceLevel.AtLeastOnce);
        }
        await Eventually.Until(() => agent.HealthAsync(), h => h.GetProperty("ingest").GetProperty("accepted").GetInt64() >= rec.Values.Count,
            TimeSpan.FromSeconds(60), "every value taken");
        var api = await agent.LoopsAsync();
        var liveAlarms = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all");

        using var run = new AnalyzeRun();
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check(rec.Loops, errors);
        var result = new OfflineAnalysis(specs).Run([run.File("gateway.csv", rec.LongCsv())]);
        Assert.Equal(rec.Values.Count, result.Values);

        foreach (var id in new[] { "PIC-201", "FIC-102" })
        {
            var live = api.EnumerateArray().Single(l => l.GetProperty("id").GetString() == id);
            var offline = JsonSerializer.SerializeToElement(LoopJson.From(result.Plant.Loop(id)!), ApiJson.Options);
            Assert.Equal(live.GetProperty("samples").GetInt64(), offline.GetProperty("samples").GetInt64());
            Assert.Equal(live.GetProperty("stats").GetRawText(), offline.GetProperty("stats").GetRawText());
            Assert.Equal(live.GetProperty("findings").GetRawText(), offline.GetProperty("findings").GetRawText());
        }
        // The alarms the agent raised are the alarms analyze reports: same ids, states and raise times.
        var agentAlarms = liveAlarms.GetProperty("alarms").EnumerateArray()
            .Select(a => $"{a.GetProperty("id").GetString()} {a.GetProperty("state").GetString()} {a.GetProperty("raised").GetRawText()}").Order().ToList();
        var analyzeAlarms = result.Alarms.Alarms().Select(a => $"{a.Id} {LoopWatch.Agent.Alarms.AlarmNames.Of(a.State)} {(a.RaisedTicks == 0 ? "null" : JsonSerializer.Serialize(new DateTimeOffset(a.RaisedTicks, TimeSpan.Zero), ApiJson.Options))}").Order().ToList();
        Assert.Equal(agentAlarms, analyzeAlarms);
        Assert.Contains(agentAlarms, a => a.StartsWith("PIC-201:sustained-offset unacknowledged", StringComparison.Ordinal));

        // The comparison is not empty: the offset detector raised on PIC-201 in both (Seborg et al.: P-only control leaves an offset).
        Assert.Contains("sustained-offset", api.EnumerateArray().Single(l => l.GetProperty("id").GetString() == "PIC-201").GetProperty("findings").GetRawText());
        Assert.Contains(result.Loops.Single(l => l.Spec.Id == "PIC-201").Findings, f => f.Kind == "sustained-offset");
    }
}

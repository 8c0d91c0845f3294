using LoopWatch.Agent.Tests.Infrastructure;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Ingest;

public sealed class LiveIngestTests
{
    [Fact]
    public async Task Values_published_to_the_embedded_broker_show_in_api_loops()
    {
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-900")], embedded: true, brokerPort: port);
        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId("test-publisher").Build());
        await agent.UntilSubscribedAsync();

        await client.PublishStringAsync("test/FIC-900/pv", """{"value": 123.5, "timestamp": "2026-03-02T00:00:01Z"}""");
        await client.PublishStringAsync("test/FIC-900/sp", """{"value": 125, "timestamp": "2026-03-02T00:00:01Z"}""");
        await client.PublishStringAsync("test/FIC-900/op", "41.25");
        await client.PublishStringAsync("test/FIC-900/mode", "manual");

        var loop = await Eventually.Until(() => agent.LoopAsync("FIC-900"),
            l => l is { } x && x.GetProperty("op").ValueKind == System.Text.Json.JsonValueKind.Number && x.GetProperty("mode").GetString() == "manual",
            what: "values in /api/loops");
        var l = loop!.Value;
        Assert.Equal(123.5, l.GetProperty("pv").GetDouble());
        Assert.Equal(125, l.GetProperty("sp").GetDouble());
        Assert.Equal(41.25, l.GetProperty("op").GetDouble());
        Assert.Equal("pid", l.GetProperty("kind").GetString());
        Assert.Equal("Test area", l.GetProperty("area").GetString());
        Assert.Equal("m3/h", l.GetProperty("unit").GetString());
        Assert.Equal(System.Text.Json.JsonValueKind.Array, l.GetProperty("findings").ValueKind);
        Assert.NotEqual(System.Text.Json.JsonValueKind.Null, l.GetProperty("last_update").ValueKind);
    }

    [Fact]
    public async Task Mosquitto_fed_by_mosquitto_pub_delivers_values_and_a_bad_payload_is_only_counted()
    {
        await using var broker = await Mosquitto.StartAsync();
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-901"), TestLoops.Pid("FIC-902")], embedded: false, brokerPort: broker.Port);
        await agent.UntilSubscribedAsync();

        await broker.PublishAsync("test/FIC-901/pv", "77.5", qos: 1);
        await broker.PublishAsync("test/FIC-901/pv", "not a number {", qos: 1);
        await broker.PublishAsync("test/FIC-902/pv", """{"value": 12.0, "quality": "good"}""", qos: 1);
        await broker.PublishAsync("test/FIC-902/op", "true", qos: 1); // a boolean on a pid output is not a percentage
        await broker.PublishAsync("test/FIC-901/op", "55", qos: 1);

        var health = await Eventually.Until(() => agent.HealthAsync(),
            h => h.GetProperty("ingest").GetProperty("received").GetInt64() >= 5, what: "five messages received");
        var ingest = health.GetProperty("ingest");
        Assert.Equal(2, ingest.GetProperty("rejected").GetInt64());
        Assert.Equal(3, ingest.GetProperty("accepted").GetInt64());

        var l901 = (await agent.LoopAsync("FIC-901"))!.Value;
        Assert.Equal(77.5, l901.GetProperty("pv").GetDouble()); // the bad payload did not replace the good value
        Assert.Equal(55, l901.GetProperty("op").GetDouble());
        var l902 = (await agent.LoopAsync("FIC-902"))!.Value;
        Assert.Equal(12.0, l902.GetProperty("pv").GetDouble());
        Assert.Equal(System.Text.Json.JsonValueKind.Null, l902.GetProperty("op").ValueKind);
    }
}

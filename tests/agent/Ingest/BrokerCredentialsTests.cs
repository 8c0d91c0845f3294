using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Tests.Infrastructure;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Testing;
using MQTTnet;
using MQTTnet.Exceptions;

namespace LoopWatch.Agent.Tests.Ingest;

/// <summary>Broker credentials from the environment, required by the embedded broker, and never written to a log.</summary>
[Collection(EnvironmentCollection.Name)]
public sealed class BrokerCredentialsTests
{
    [Fact]
    public async Task Credentials_from_the_environment_are_required_by_the_embedded_broker_and_never_logged()
    {
        var password = $"pw-{Guid.NewGuid():N}";
        var wrong = $"wrong-{Guid.NewGuid():N}";
        var options = FromEnvironment("quillmoor-agent", password);
        Assert.Equal(("quillmoor-agent", password), (options.Broker.Username, options.Broker.Password));

        var logs = new FakeLoggerProvider();
        void Capture(ILoggingBuilder b) { b.SetMinimumLevel(LogLevel.Trace); b.AddProvider(logs); }
        var port = FreePort.Next();
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-940")], embedded: true, brokerPort: port, logging: Capture,
            tweak: o => { o.Broker.Username = options.Broker.Username; o.Broker.Password = options.Broker.Password; });
        // The agent's own subscription gets in with the configured credentials.
        await agent.UntilSubscribedAsync("agent subscribed with credentials");

        // Anyone else needs them too.
        Assert.False(await ConnectsAsync(port, null, null));
        Assert.False(await ConnectsAsync(port, "quillmoor-agent", wrong));
        Assert.True(await ConnectsAsync(port, "quillmoor-agent", password));

        // A second agent with the wrong password is refused and keeps retrying, logging why.
        await using (var refused = await RunningAgent.StartAsync([TestLoops.Pid("FIC-941")], embedded: false, brokerPort: port, logging: Capture,
            tweak: o => { o.Broker.Username = "quillmoor-agent"; o.Broker.Password = wrong; }))
        {
            await Eventually.Until(() => Task.FromResult(logs.Collector.GetSnapshot().Count(r => r.Id.Id == 1003)), n => n >= 1, what: "refusal logged");
            Assert.False((await refused.HealthAsync()).GetProperty("ingest").GetProperty("broker_connected").GetBoolean());
        }

        // Neither password appears in any log line, its structured values or an exception text.
        var records = logs.Collector.GetSnapshot();
        Assert.True(records.Count > 5, $"{records.Count} log records captured");
        foreach (var r in records)
        {
            var text = string.Join(" ", new[] { r.Message, r.Exception?.ToString() ?? "" }
                .Concat(r.StructuredState?.Select(kv => $"{kv.Key}={kv.Value}") ?? []));
            Assert.DoesNotContain(password, text);
            Assert.DoesNotContain(wrong, text);
        }
    }

    [Fact]
    public async Task A_non_loopback_embedded_broker_without_credentials_is_refused_at_check()
    {
        var file = Path.Combine(Directory.CreateTempSubdirectory("lw-cfg-").FullName, "loops.json");
        await File.WriteAllTextAsync(file, """
            { "LoopWatch": { "Broker": { "Embedded": true, "ListenAddress": "0.0.0.0" },
              "Loops": [ { "Id": "FIC-101", "Kind": "pid", "Pv": { "Tag": "a/pv", "Min": 0, "Max": 1 }, "Sp": { "Tag": "a/sp" }, "Op": { "Tag": "a/op" } } ] } }
            """);
        var err = new StringWriter();
        Assert.Equal(2, await Cli.RunAsync(["check", "--config", file], new StringWriter(), err));
        Assert.Contains("Broker:ListenAddress", err.ToString());
        // The same address with credentials passes the check (not started here: tests bind loopback only).
        var ok = await File.ReadAllTextAsync(file);
        await File.WriteAllTextAsync(file, ok.Replace("\"ListenAddress\": \"0.0.0.0\"", "\"ListenAddress\": \"0.0.0.0\", \"Username\": \"gw\", \"Password\": \"s3cret-pw\""));
        var out2 = new StringWriter();
        var err2 = new StringWriter();
        Assert.Equal(0, await Cli.RunAsync(["check", "--config", file], out2, err2));
        Assert.DoesNotContain("s3cret-pw", out2.ToString() + err2.ToString());
    }

    private static AgentOptions FromEnvironment(string user, string password) =>
        EnvironmentOptions.Load(("LOOPWATCH__BROKER__USERNAME", user), ("LOOPWATCH__BROKER__PASSWORD", password));

    private static async Task<bool> ConnectsAsync(int port, string? user, string? password)
    {
        using var client = new MqttClientFactory().CreateMqttClient();
        var builder = new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).WithClientId($"probe-{Guid.NewGuid():N}");
        if (user is not null) builder.WithCredentials(user, password);
        try
        {
            var result = await client.ConnectAsync(builder.Build());
            return result.ResultCode == MqttClientConnectResultCode.Success;
        }
        catch (MqttCommunicationException)
        {
            return false;
        }
    }
}

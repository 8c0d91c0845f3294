using System.Globalization;
using System.Text.Json;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Tests.Configuration;
using LoopWatch.Agent.Tests.Infrastructure;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Testing;

namespace LoopWatch.Agent.Tests.Ingest;

/// <summary>
/// TLS to a real Mosquitto on a loopback TLS listener, with a CA and certificates made by the test: the site CA trusted
/// from Broker:CaFile, refusals (system store, another CA, a wrong name) with the reason logged, mutual TLS, and no
/// secret or key material in any log record.
/// </summary>
[Collection(EnvironmentCollection.Name)]
public sealed class BrokerTlsTests
{
    [Fact]
    public async Task With_the_site_CA_the_agent_connects_over_TLS_and_takes_the_values()
    {
        using var pki = TestPki.Create("Quillmoor Works site CA");
        await using var broker = await Mosquitto.StartTlsAsync(pki, pki.IssueServer("Quillmoor broker"));
        var logs = new FakeLoggerProvider();
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-960")], embedded: false, brokerPort: broker.Port, logging: Capture(logs),
            tweak: o => { o.Broker.UseTls = true; o.Broker.CaFile = pki.CaFile; });

        await UntilConnected(agent);
        await PublishLoopAsync(broker, "FIC-960");
        await UntilAccepted(agent, 3);
        Assert.Contains(logs.Collector.GetSnapshot(), r => r.Id.Id == 1002);
        // The accepted certificate is logged with its end of validity, for renewals.
        var tls = logs.Collector.GetSnapshot().First(r => r.Id.Id == 1009).Message;
        Assert.Contains($"127.0.0.1:{broker.Port}", tls);
        Assert.Contains("'CN=Quillmoor broker, O=Quillmoor Works' issued by 'CN=Quillmoor Works site CA, O=Quillmoor Works', valid until", tls);
        await UntilHealthRetained(broker, "FIC-960");
        Assert.DoesNotContain(logs.Collector.GetSnapshot(), r => r.Id.Id is 1003 or 1008);
    }

    [Fact]
    public async Task Without_the_site_CA_or_with_another_CA_the_agent_refuses_the_broker_logs_why_and_keeps_retrying()
    {
        using var site = TestPki.Create("Quillmoor Works site CA");
        using var other = TestPki.Create("Quillmoor Works retired CA");
        await using var broker = await Mosquitto.StartTlsAsync(site, site.IssueServer("Quillmoor broker"));
        var systemLogs = new FakeLoggerProvider();
        var otherLogs = new FakeLoggerProvider();
        // The operating system's trust store (no CaFile) knows nothing of the site's CA; a CA file of another CA neither.
        await using var systemStore = await RunningAgent.StartAsync([TestLoops.Pid("FIC-961")], embedded: false, brokerPort: broker.Port, logging: Capture(systemLogs),
            tweak: o => o.Broker.UseTls = true);
        await using var otherCa = await RunningAgent.StartAsync([TestLoops.Pid("FIC-962")], embedded: false, brokerPort: broker.Port, logging: Capture(otherLogs),
            tweak: o => { o.Broker.UseTls = true; o.Broker.CaFile = other.CaFile; });

        foreach (var (agent, logs) in new[] { (systemStore, systemLogs), (otherCa, otherLogs) })
        {
            // Retries back off 1, 2 ... s (BrokerFaultTests checks the doubling); two of them prove the agent goes on.
            var delays = await UntilRetries(logs, 2);
            Assert.Equal([1.0, 2.0], delays.Take(2));
            var refusal = logs.Collector.GetSnapshot().First(r => r.Id.Id == 1008);
            Assert.Equal(LogLevel.Warning, refusal.Level);
            Assert.Contains($"127.0.0.1:{broker.Port}", refusal.Message);
            Assert.Contains("not trusted", refusal.Message);
            Assert.Contains("Quillmoor broker", refusal.Message);
            Assert.Contains($"127.0.0.1:{broker.Port}", logs.Collector.GetSnapshot().First(r => r.Id.Id == 1003).Message);
            // Still running and answering, just not connected.
            var health = await agent.HealthAsync();
            Assert.False(health.GetProperty("ingest").GetProperty("broker_connected").GetBoolean());
        }
    }

    [Fact]
    public async Task A_broker_known_by_another_name_is_refused_until_Broker_TlsServerName_gives_that_name()
    {
        using var pki = TestPki.Create("Quillmoor Works site CA");
        // The certificate carries only a DNS name, not the address the agent dials.
        await using var broker = await Mosquitto.StartTlsAsync(pki, pki.IssueServer("Quillmoor broker", "mqtt.quillmoor.test"));
        var wrongLogs = new FakeLoggerProvider();
        await using (var byAddress = await RunningAgent.StartAsync([TestLoops.Pid("FIC-963")], embedded: false, brokerPort: broker.Port, logging: Capture(wrongLogs),
            tweak: o => { o.Broker.UseTls = true; o.Broker.CaFile = pki.CaFile; }))
        {
            await UntilRetries(wrongLogs, 1);
            Assert.Contains("names do not include", wrongLogs.Collector.GetSnapshot().First(r => r.Id.Id == 1008).Message);
        }

        await using var byName = await RunningAgent.StartAsync([TestLoops.Pid("FIC-964")], embedded: false, brokerPort: broker.Port,
            tweak: o => { o.Broker.UseTls = true; o.Broker.CaFile = pki.CaFile; o.Broker.TlsServerName = "mqtt.quillmoor.test"; });
        await UntilConnected(byName);
    }

    [Fact]
    public async Task Mutual_TLS_with_a_client_certificate_from_the_environment_connects_and_no_secret_or_key_reaches_a_log()
    {
        using var pki = TestPki.Create("Quillmoor Works site CA");
        var keyPassword = $"kp-{Guid.NewGuid():N}";
        var password = $"pw-{Guid.NewGuid():N}";
        var client = pki.IssueClient("loopwatch-agent", keyPassword);
        await using var broker = await Mosquitto.StartTlsAsync(pki, pki.IssueServer("Quillmoor broker"), requireCertificate: true,
            publisher: pki.IssueClient("Quillmoor gateway"));
        var options = EnvironmentOptions.Load(
            ("LOOPWATCH__BROKER__USETLS", "true"),
            ("LOOPWATCH__BROKER__CAFILE", pki.CaFile),
            ("LOOPWATCH__BROKER__CERTFILE", client.CertFile),
            ("LOOPWATCH__BROKER__KEYFILE", client.KeyFile),
            ("LOOPWATCH__BROKER__KEYPASSWORD", keyPassword),
            ("LOOPWATCH__BROKER__USERNAME", "quillmoor-agent"),
            ("LOOPWATCH__BROKER__PASSWORD", password));
        Assert.Equal((client.KeyFile, keyPassword), (options.Broker.KeyFile, options.Broker.KeyPassword));

        var logs = new FakeLoggerProvider();
        // Without a client certificate the broker ends the handshake; the agent says so and retries.
        await using (var without = await RunningAgent.StartAsync([TestLoops.Pid("FIC-965")], embedded: false, brokerPort: broker.Port, logging: Capture(logs),
            tweak: o => { o.Broker.UseTls = true; o.Broker.CaFile = pki.CaFile; }))
        {
            await UntilRetries(logs, 2);
            Assert.False((await without.HealthAsync()).GetProperty("ingest").GetProperty("broker_connected").GetBoolean());
        }

        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-966")], embedded: false, brokerPort: broker.Port, logging: Capture(logs),
            tweak: o =>
            {
                var b = options.Broker;
                (o.Broker.UseTls, o.Broker.CaFile, o.Broker.CertFile, o.Broker.KeyFile, o.Broker.KeyPassword) = (b.UseTls, b.CaFile, b.CertFile, b.KeyFile, b.KeyPassword);
                (o.Broker.Username, o.Broker.Password) = (b.Username, b.Password);
            });
        await UntilConnected(agent);
        await PublishLoopAsync(broker, "FIC-966");
        await UntilAccepted(agent, 3);
        // The side connection (health messages) goes through the same TLS settings, client certificate included.
        await UntilHealthRetained(broker, "FIC-966");

        // Neither password nor any line of the private key in a message, a structured value or an exception text.
        var keyLines = client.KeyPem.Split('\n', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries).Where(l => !l.StartsWith("-----", StringComparison.Ordinal)).ToList();
        Assert.NotEmpty(keyLines);
        var records = logs.Collector.GetSnapshot();
        Assert.True(records.Count > 5, $"{records.Count} log records captured");
        foreach (var r in records)
        {
            var text = string.Join(" ", new[] { r.Message, r.Exception?.ToString() ?? "" }.Concat(r.StructuredState?.Select(kv => $"{kv.Key}={kv.Value}") ?? []));
            Assert.DoesNotContain(password, text);
            Assert.DoesNotContain(keyPassword, text);
            Assert.DoesNotContain("PRIVATE KEY", text);
            foreach (var line in keyLines) Assert.DoesNotContain(line, text);
        }
    }

    [Fact]
    public async Task Tls_files_that_cannot_be_used_exit_2_naming_the_key_and_a_usable_set_passes()
    {
        using var pki = TestPki.Create("Quillmoor Works site CA");
        var keyPassword = $"kp-{Guid.NewGuid():N}";
        var client = pki.IssueClient("loopwatch-agent", keyPassword);
        var stranger = pki.IssueClient("someone else");
        var notPem = Path.Combine(pki.Dir, "notes.txt");
        await File.WriteAllTextAsync(notPem, "not a certificate");
        var missing = Path.Combine(pki.Dir, "missing.pem");
        var wrongPassword = $"wrong-{Guid.NewGuid():N}";

        (string Broker, string Named)[] cases =
        [
            ($$"""{ "UseTls": true, "CaFile": {{J(missing)}} }""", "Broker:CaFile"),
            ($$"""{ "UseTls": true, "CaFile": {{J(notPem)}} }""", "Broker:CaFile"),
            ($$"""{ "UseTls": true, "CaFile": {{J(client.KeyFile)}} }""", "Broker:CaFile"), // a key, no certificate
            ($$"""{ "UseTls": false, "CaFile": {{J(pki.CaFile)}} }""", "Broker:CaFile"), // TLS files without TLS
            ($$"""{ "UseTls": true, "CertFile": {{J(client.CertFile)}} }""", "Broker:KeyFile"),
            ($$"""{ "UseTls": true, "KeyFile": {{J(client.KeyFile)}} }""", "Broker:CertFile"),
            ($$"""{ "UseTls": true, "CertFile": {{J(client.CertFile)}}, "KeyFile": {{J(stranger.KeyFile)}} }""", "Broker:CertFile"), // another certificate's key
            ($$"""{ "UseTls": true, "CertFile": {{J(client.CertFile)}}, "KeyFile": {{J(client.KeyFile)}} }""", "Broker:CertFile"), // encrypted, no password
            ($$"""{ "UseTls": true, "CertFile": {{J(client.CertFile)}}, "KeyFile": {{J(client.KeyFile)}}, "KeyPassword": {{J(wrongPassword)}} }""", "Broker:CertFile"),
            ($$"""{ "UseTls": true, "CertFile": {{J(client.CertFile)}}, "KeyFile": {{J(missing)}} }""", "Broker:KeyFile"),
            ("""{ "UseTls": true, "TlsServerName": "not a name" }""", "Broker:TlsServerName"),
            ("""{ "UseTls": true, "Embedded": true }""", "Broker:UseTls"), // the embedded broker has no TLS listener
        ];
        foreach (var (broker, named) in cases)
        {
            var (code, err) = await ConfigurationErrorTests.Check(Config(broker));
            Assert.True(code == 2 && err.Contains(named), $"{broker}: exit {code}, {err}");
            Assert.DoesNotContain(wrongPassword, err);
            Assert.DoesNotContain(keyPassword, err);
        }

        var ok = $$"""{ "UseTls": true, "CaFile": {{J(pki.CaFile)}}, "CertFile": {{J(client.CertFile)}}, "KeyFile": {{J(client.KeyFile)}}, "KeyPassword": {{J(keyPassword)}}, "TlsServerName": "mqtt.quillmoor.test" }""";
        var (okCode, okErr) = await ConfigurationErrorTests.Check(Config(ok));
        Assert.True(okCode == 0, okErr);
    }

    private static string J(string s) => JsonSerializer.Serialize(s);

    private static string Config(string broker) => $$"""
        { "LoopWatch": { "Broker": {{broker}}, "Loops": [ { "Id": "FIC-101", "Kind": "pid", "Process": "flow",
            "Pv": { "Tag": "a/pv", "Min": 0, "Max": 250, "Unit": "m3/h" }, "Sp": { "Tag": "a/sp" }, "Op": { "Tag": "a/op" } } ] } }
        """;

    private static Action<ILoggingBuilder> Capture(FakeLoggerProvider logs) => b => { b.SetMinimumLevel(LogLevel.Trace); b.AddProvider(logs); };

    private static Task UntilConnected(RunningAgent agent) =>
        agent.UntilSubscribedAsync("agent subscribed over TLS");

    private static Task UntilAccepted(RunningAgent agent, long count) =>
        Eventually.Until(async () => (await agent.HealthAsync()).GetProperty("ingest").GetProperty("accepted").GetInt64(), n => n >= count, what: $"{count} values accepted");

    /// <summary>Waits for the loop's retained health message, read over TLS by mosquitto_sub: the agent's side connection got in.</summary>
    private static Task UntilHealthRetained(Mosquitto broker, string id) =>
        Eventually.Until(() => broker.SubscribeOneAsync($"loopwatch/{id}/health"), o => o.StartsWith($"loopwatch/{id}/health {{", StringComparison.Ordinal),
            TimeSpan.FromSeconds(20), "health message published over TLS");

    /// <summary>One value on each of the loop's PV, SP and OP tags, published over the broker's TLS listener at QoS 1.</summary>
    private static async Task PublishLoopAsync(Mosquitto broker, string id)
    {
        await broker.PublishAsync($"test/{id}/pv", "101.5", qos: 1);
        await broker.PublishAsync($"test/{id}/sp", "100", qos: 1);
        await broker.PublishAsync($"test/{id}/op", "42", qos: 1);
    }

    /// <summary>Waits for <paramref name="count"/> retry lines (1003) and returns their delays in seconds.</summary>
    private static async Task<List<double>> UntilRetries(FakeLoggerProvider logs, int count)
    {
        List<double> Delays() => logs.Collector.GetSnapshot().Where(r => r.Id.Id == 1003)
            .Select(r => double.Parse(r.StructuredState!.Single(kv => kv.Key == "DelaySeconds").Value!, CultureInfo.InvariantCulture)).ToList();
        return await Eventually.Until(() => Task.FromResult(Delays()), d => d.Count >= count, TimeSpan.FromSeconds(20), $"{count} retries logged");
    }
}

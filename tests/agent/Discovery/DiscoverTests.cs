using System.Text.Json;
using Google.Protobuf;
using LoopWatch.Agent.Discovery;
using LoopWatch.Agent.Sparkplug.Wire;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Discovery;

// Discover reads LOOPWATCH__BROKER__ variables like the agent, so it runs apart from tests that set them.
[Collection(EnvironmentCollection.Name)]
public sealed class DiscoverTests
{
    private static readonly JsonDocumentOptions Commented = new() { CommentHandling = JsonCommentHandling.Skip };

    [Fact]
    public async Task Discover_proposes_loops_from_retained_topics_with_reasons_lists_the_rest_and_the_proposal_passes_check()
    {
        await using var broker = await Mosquitto.StartAsync();
        // Retained, so discovery hears them the moment it subscribes.
        foreach (var (topic, value) in new[]
        {
            ("quillmoor/FIC-101/pv", "42.5"), ("quillmoor/FIC-101/sp", "45"), ("quillmoor/FIC-101/op", "38.2"), ("quillmoor/FIC-101/mode", "auto"),
            ("quillmoor/LIC-301/pv", """{"value": 1.8, "timestamp": "2026-03-02T00:00:00Z"}"""), ("quillmoor/LIC-301/out", "true"),
            ("boiler/TIC-401.PV", "81.5"), ("boiler/TIC-401.SP", "80"), ("boiler/TIC-401.OUT", "55"),
            ("quillmoor/FIC-102/cv", "30"), ("quillmoor/FIC-102/mv", "40"), ("quillmoor/FIC-102/sp", "31"),
            ("quillmoor/XIC-900/pv", "5"), ("quillmoor/XIC-900/sp", "5"), ("quillmoor/XIC-900/op", "10"),
            ("quillmoor/PIC-201/pv", "3.2"), ("quillmoor/PIC-201/sp", "3.5"),
            ("quillmoor/ambient/temperature", "12.3"),
            ("quillmoor/FIC-103/pv", "not a value"),
        })
            await broker.PublishAsync(topic, value, qos: 1, retain: true);
        // A Sparkplug NBIRTH, encoded by Google.Protobuf and sent as bytes with mosquitto_pub -f.
        var birth = Path.Combine(Directory.CreateTempSubdirectory("lw-discover-").FullName, "nbirth.bin");
        await File.WriteAllBytesAsync(birth, new Payload
        {
            Timestamp = 1772409600000, Seq = 0,
            Metrics =
            {
                new Payload.Types.Metric { Name = "bdSeq", Datatype = (uint)DataType.Int64, LongValue = 0 },
                new Payload.Types.Metric { Name = "FIC-601/PV", Alias = 1, Datatype = (uint)DataType.Float, FloatValue = 12.5f },
                new Payload.Types.Metric { Name = "FIC-601/SP", Alias = 2, Datatype = (uint)DataType.Float, FloatValue = 12f },
                new Payload.Types.Metric { Name = "FIC-601/OP", Alias = 3, Datatype = (uint)DataType.Float, FloatValue = 47f },
            },
        }.ToByteArray());
        await broker.PublishFileAsync("spBv1.0/Quillmoor/NBIRTH/Boiler", birth, retain: true);

        var file = Path.Combine(Path.GetDirectoryName(birth)!, "proposed.json");
        var err = new StringWriter();
        var code = await Cli.RunAsync(["discover", "--broker", $"127.0.0.1:{broker.Port}", "--seconds", "1.5", "--out", file], new StringWriter(), err);
        Assert.True(code == 0, err.ToString());
        var text = await File.ReadAllTextAsync(file);
        using var doc = JsonDocument.Parse(text, Commented);
        var loops = doc.RootElement.GetProperty("LoopWatch").GetProperty("Loops").EnumerateArray().ToDictionary(l => l.GetProperty("Id").GetString()!);

        Assert.Equal(["FIC-101", "FIC-102", "FIC-601", "LIC-301", "TIC-401", "XIC-900"], loops.Keys.Order());
        var fic = loops["FIC-101"];
        Assert.Equal("pid", fic.GetProperty("Kind").GetString());
        Assert.Equal("flow", fic.GetProperty("Process").GetString()); // ISA-5.1: first letter F = flow
        Assert.Equal("quillmoor/FIC-101/mode", fic.GetProperty("Mode").GetProperty("Tag").GetString());
        // Range from the values seen (42.5 to 45) widened by 10 % of 2.5 and rounded outwards to 0.1: 42.2..45.3.
        Assert.Equal(42.2, fic.GetProperty("Pv").GetProperty("Min").GetDouble(), 9);
        Assert.Equal(45.3, fic.GetProperty("Pv").GetProperty("Max").GetDouble(), 9);

        var lic = loops["LIC-301"];
        Assert.Equal("on-off", lic.GetProperty("Kind").GetString()); // a true/false output: two-position control (common practice, no source)
        Assert.Equal("level", lic.GetProperty("Process").GetString()); // ISA-5.1: L = level
        Assert.False(lic.TryGetProperty("Sp", out _));
        Assert.Equal("boiler/TIC-401.OUT", loops["TIC-401"].GetProperty("Op").GetProperty("Tag").GetString());
        Assert.Equal("temperature", loops["TIC-401"].GetProperty("Process").GetString()); // ISA-5.1: T = temperature
        Assert.Equal("quillmoor/FIC-102/cv", loops["FIC-102"].GetProperty("Pv").GetProperty("Tag").GetString()); // cv beside an mv is the controlled variable
        Assert.Equal("other", loops["XIC-900"].GetProperty("Process").GetString()); // ISA-5.1: X is unclassified
        Assert.Equal("spBv1.0/Quillmoor/Boiler:FIC-601/PV", loops["FIC-601"].GetProperty("Pv").GetProperty("Tag").GetString());

        // Never silent: each loop's reasons and each unpaired topic are in the file for the engineer.
        Assert.Contains("FIC-101: Process flow: ISA-5.1 first letter F in FIC-101", text);
        Assert.Contains("LIC-301: Kind on-off: the output only carried 0/1 or true/false", text);
        Assert.Contains("FIC-102: quillmoor/FIC-102/cv read as the controlled variable (PV)", text);
        Assert.Contains("quillmoor/PIC-201/pv: PIC-201: only", text);
        Assert.Contains("quillmoor/ambient/temperature: its name does not end in a loop part", text);
        Assert.Contains("quillmoor/FIC-103/pv: no readable value", text);
        Assert.Contains("Not paired (4)", text);

        var checkOut = new StringWriter();
        var checkErr = new StringWriter();
        Assert.Equal(0, await Cli.RunAsync(["check", "--config", file], checkOut, checkErr));
        Assert.Equal("configuration ok: 6 loops", checkOut.ToString().Trim());
    }

    [Theory]
    [InlineData("area/FIC-101/pv", "area/FIC-101", "FIC-101", TagRole.Pv)]
    [InlineData("FIC-101.PV", "FIC-101", "FIC-101", TagRole.Pv)]
    [InlineData("plant/FIC_101_OUT", "plant/FIC_101", "FIC_101", TagRole.Op)]
    [InlineData("spBv1.0/Quillmoor/Boiler/Skid:Loops/TIC-7.SP", "spBv1.0/Quillmoor/Boiler/Skid:Loops/TIC-7", "TIC-7", TagRole.Sp)]
    public void TagName_splits_common_naming_patterns(string tag, string key, string id, TagRole role)
    {
        Assert.True(TagName.TryParse(tag, out var name));
        Assert.Equal((key, id, role), (name.LoopKey, name.LoopId, name.Role));
    }

    [Theory]
    [InlineData("spBv1.0/Quillmoor/Boiler:PV")]
    [InlineData("quillmoor/FIC-101/flow")]
    [InlineData("pv")]
    public void TagName_refuses_names_without_a_loop_part(string tag) => Assert.False(TagName.TryParse(tag, out _));

    [Fact]
    public async Task Discover_reaches_a_TLS_broker_with_the_site_CA_from_the_configuration_file_and_refuses_it_without()
    {
        using var pki = TestPki.Create("Quillmoor Works site CA");
        using var other = TestPki.Create("Quillmoor Works retired CA");
        await using var broker = await Mosquitto.StartTlsAsync(pki, pki.IssueServer("Quillmoor broker"));
        foreach (var (topic, value) in new[] { ("quillmoor/FIC-150/pv", "12.5"), ("quillmoor/FIC-150/sp", "12"), ("quillmoor/FIC-150/op", "47") })
            await broker.PublishAsync(topic, value, qos: 1, retain: true);
        var dir = Directory.CreateTempSubdirectory("lw-discover-tls-").FullName;
        string Config(string name, string? ca)
        {
            var file = Path.Combine(dir, name);
            File.WriteAllText(file, $$"""
                { "LoopWatch": { "Broker": { "Host": "127.0.0.1", "Port": {{broker.Port}}, "UseTls": true{{(ca is null ? "" : $", \"CaFile\": {JsonSerializer.Serialize(ca)}")}} } } }
                """);
            return file;
        }

        var stdout = new StringWriter();
        var err = new StringWriter();
        Assert.True(await Cli.RunAsync(["discover", "--config", Config("site.json", pki.CaFile), "--seconds", "1.5"], stdout, err) == 0, err.ToString());
        Assert.Contains("over TLS", err.ToString());
        using (var doc = JsonDocument.Parse(stdout.ToString(), Commented))
            Assert.Equal("quillmoor/FIC-150/pv", doc.RootElement.GetProperty("LoopWatch").GetProperty("Loops")[0].GetProperty("Pv").GetProperty("Tag").GetString());

        // Another CA's file: the broker's certificate does not chain to it, so discover stops and says why.
        var refused = new StringWriter();
        Assert.Equal(1, await Cli.RunAsync(["discover", "--config", Config("retired.json", other.CaFile), "--seconds", "1"], new StringWriter(), refused));
        Assert.Contains("not trusted", refused.ToString());
        // Plain MQTT to a TLS listener gets no MQTT answer.
        Assert.Equal(1, await Cli.RunAsync(["discover", "--broker", $"127.0.0.1:{broker.Port}", "--seconds", "1"], new StringWriter(), new StringWriter()));
    }

    [Fact]
    public async Task Discover_without_a_broker_option_exits_2()
    {
        var err = new StringWriter();
        Assert.Equal(2, await Cli.RunAsync(["discover", "--seconds", "1"], new StringWriter(), err));
        Assert.Contains("--broker: is required", err.ToString());
        var tls = new StringWriter();
        // A client certificate without its key is a usage error, named by key, as for the agent.
        var file = Path.Combine(Directory.CreateTempSubdirectory("lw-discover-cfg-").FullName, "bad.json");
        await File.WriteAllTextAsync(file, """{ "LoopWatch": { "Broker": { "UseTls": true, "CertFile": "/nonexistent/client.pem" } } }""");
        Assert.Equal(2, await Cli.RunAsync(["discover", "--config", file, "--seconds", "1"], new StringWriter(), tls));
        Assert.Contains("Broker:", tls.ToString());
    }
}

namespace LoopWatch.Agent.Tests.Configuration;

[Collection(Infrastructure.EnvironmentCollection.Name)]
public sealed class ConfigurationErrorTests
{
    /// <summary>Runs <c>loopwatch check</c> on <paramref name="json"/> written to a temp file.</summary>
    internal static async Task<(int Code, string Err)> Check(string json)
    {
        var file = Path.Combine(Directory.CreateTempSubdirectory("lw-cfg-").FullName, "loops.json");
        await File.WriteAllTextAsync(file, json);
        var err = new StringWriter();
        var code = await Cli.RunAsync(["check", "--config", file], new StringWriter(), err);
        return (code, err.ToString());
    }

    private const string Good = """
        { "LoopWatch": { "Loops": [ { "Id": "FIC-101", "Kind": "pid", "Process": "flow",
            "Pv": { "Tag": "a/pv", "Min": 0, "Max": 250, "Unit": "m3/h" }, "Sp": { "Tag": "a/sp" }, "Op": { "Tag": "a/op" } } ] } }
        """;

    [Fact]
    public async Task A_valid_configuration_checks_ok()
    {
        var (code, err) = await Check(Good);
        Assert.Equal(0, code);
        Assert.Equal("", err);
    }

    [Theory]
    [InlineData("\"Kind\": \"pid\"", "\"Kind\": \"cascade-ish\"", "Loops:0 (FIC-101): Kind")]
    [InlineData("\"Tag\": \"a/pv\", ", "", "Loops:0 (FIC-101): Pv:Tag")]
    [InlineData("\"Min\": 0, \"Max\": 250", "\"Min\": 250, \"Max\": 250", "Loops:0 (FIC-101): Pv:Max")]
    [InlineData("\"Process\": \"flow\"", "\"Process\": \"viscosity\"", "Loops:0 (FIC-101): Process")]
    [InlineData("\"Op\": { \"Tag\": \"a/op\" }", "\"Op\": { \"Tag\": \"a/op\" }, \"Limits\": { \"OffsetPct\": -1 }", "Loops:0 (FIC-101): Limits:OffsetPct")]
    [InlineData("\"Op\": { \"Tag\": \"a/op\" }", "\"Op\": { \"Tag\": \"a/op\" }, \"Tuning\": { \"DeadTimeSeconds\": 0 }", "Loops:0 (FIC-101): Tuning:DeadTimeSeconds")]
    [InlineData("\"Op\": { \"Tag\": \"a/op\" }", "\"Op\": { \"Tag\": \"a/op\" }, \"Tuning\": { \"TimeConstantSeconds\": -5 }", "Loops:0 (FIC-101): Tuning:TimeConstantSeconds")]
    [InlineData("{ \"LoopWatch\": {", "{ \"LoopWatch\": { \"Dashboard\": { \"ShiftHours\": 7 },", "Dashboard:ShiftHours")]
    [InlineData("{ \"LoopWatch\": {", "{ \"LoopWatch\": { \"Dashboard\": { \"TimeZone\": \"Mars/Olympus\" },", "Dashboard:TimeZone")]
    [InlineData("{ \"LoopWatch\": {", "{ \"LoopWatch\": { \"Broker\": { \"Port\": 70000 },", "Broker:Port")]
    [InlineData("{ \"LoopWatch\": {", "{ \"LoopWatch\": { \"Valves\": { \"ServiceAfterStrokes\": 0 },", "Valves:ServiceAfterStrokes")]
    public async Task An_invalid_setting_exits_2_naming_loop_and_key(string from, string to, string expected)
    {
        var (code, err) = await Check(Good.Replace(from, to));
        Assert.Equal(2, code);
        Assert.Contains(expected, err);
    }

    [Fact]
    public async Task A_duplicate_id_exits_2_naming_the_second_loop()
    {
        var json = """
            { "LoopWatch": { "Loops": [
              { "Id": "FIC-101", "Kind": "pid", "Pv": { "Tag": "a/pv", "Min": 0, "Max": 1 }, "Sp": { "Tag": "a/sp" }, "Op": { "Tag": "a/op" } },
              { "Id": "FIC-101", "Kind": "pid", "Pv": { "Tag": "b/pv", "Min": 0, "Max": 1 }, "Sp": { "Tag": "b/sp" }, "Op": { "Tag": "b/op" } } ] } }
            """;
        var (code, err) = await Check(json);
        Assert.Equal(2, code);
        Assert.Contains("Loops:1 (FIC-101): Id", err);
    }

    [Fact]
    public async Task A_wrongly_typed_value_exits_2_naming_the_key()
    {
        var (code, err) = await Check(Good.Replace("\"Max\": 250", "\"Max\": \"lots\""));
        Assert.Equal(2, code);
        Assert.Contains("Loops:0:Pv:Max", err);
    }

    [Fact]
    public async Task A_misspelt_key_exits_2_naming_it()
    {
        var (code, err) = await Check(Good.Replace("\"Process\"", "\"Proces\""));
        Assert.Equal(2, code);
        Assert.Contains("Proces", err);
    }

    [Fact]
    public async Task An_environment_variable_overrides_the_file()
    {
        var errors = new List<string>();
        var file = Path.Combine(Directory.CreateTempSubdirectory("lw-cfg-").FullName, "loops.json");
        await File.WriteAllTextAsync(file, Good);
        Environment.SetEnvironmentVariable("LOOPWATCH__BROKER__PORT", "18831");
        try
        {
            var options = Agent.Configuration.AgentConfiguration.Load(file, new Dictionary<string, string?>(), errors);
            Assert.Empty(errors);
            Assert.Equal(18831, options.Broker.Port);
            Assert.Equal("FIC-101", options.Loops[0].Id);
        }
        finally
        {
            Environment.SetEnvironmentVariable("LOOPWATCH__BROKER__PORT", null);
        }
    }
}

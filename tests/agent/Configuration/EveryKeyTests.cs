using System.Reflection;
using System.Text.Json.Nodes;
using LoopWatch.Agent.Configuration;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Tests.Configuration;

/// <summary>
/// Every key of the agent's configuration (agent/Configuration and analytics/Configuration) given an invalid value:
/// <c>loopwatch check</c> exits 2 and names the key. Keys are found by reflection, so a new key without a case fails.
/// </summary>
[Collection(Infrastructure.EnvironmentCollection.Name)]
public sealed class EveryKeyTests
{
    private const string Good = """
        { "LoopWatch": { "Loops": [ { "Id": "FIC-101", "Kind": "pid", "Process": "flow",
            "Pv": { "Tag": "a/pv", "Min": 0, "Max": 250, "Unit": "m3/h" }, "Sp": { "Tag": "a/sp" }, "Op": { "Tag": "a/op" } } ] } }
        """;

    /// <summary>Key (below <c>LoopWatch</c>), invalid JSON value, what the message must name.</summary>
    public static TheoryData<string, string, string> Invalid() => new()
    {
        { "Broker:Embedded", "\"maybe\"", "Broker:Embedded" },
        { "Broker:Host", "\" \"", "Broker:Host" },
        { "Broker:Port", "70000", "Broker:Port" },
        { "Broker:Port", "0", "Broker:Port" },
        { "Broker:Password", "\"secret\"", "Broker:Username" }, // a password without a user name
        { "Broker:UseTls", "\"sometimes\"", "Broker:UseTls" },
        { "Broker:CaFile", "\"/nonexistent/site-ca.pem\"", "Broker:CaFile" }, // without UseTls; unreadable files: BrokerTlsTests
        { "Broker:CertFile", "\"/nonexistent/agent.pem\"", "Broker:CertFile" },
        { "Broker:KeyFile", "\"/nonexistent/agent.key\"", "Broker:KeyFile" },
        { "Broker:KeyPassword", "\"secret\"", "Broker:KeyPassword" },
        { "Broker:TlsServerName", "\"mqtt.quillmoor.test\"", "Broker:TlsServerName" },
        { "Broker:ClientId", "\"\"", "Broker:ClientId" },
        { "Broker:MaxPendingMessagesPerClient", "0", "Broker:MaxPendingMessagesPerClient" },
        { "Broker:MaxLeadSeconds", "-1", "Broker:MaxLeadSeconds" },
        { "Broker:KeepAliveSeconds", "0", "Broker:KeepAliveSeconds" },
        { "Broker:ListenAddress", "\"not-an-address\"", "Broker:ListenAddress" },
        { "Dashboard:Urls", "\"ftp://127.0.0.1:21\"", "Dashboard:Urls" },
        { "Dashboard:Urls", "\"\"", "Dashboard:Urls" },
        { "Dashboard:RequireLoginToView", "\"perhaps\"", "Dashboard:RequireLoginToView" },
        { "Dashboard:ShiftStartHour", "24", "Dashboard:ShiftStartHour" },
        { "Dashboard:ShiftHours", "7", "Dashboard:ShiftHours" },
        { "Dashboard:TimeZone", "\"Mars/Olympus\"", "Dashboard:TimeZone" },
        { "Dashboard:MetricsAccess", "\"sometimes\"", "Dashboard:MetricsAccess" },
        { "Dashboard:WeeklyDatabases", "[\" \"]", "Dashboard:WeeklyDatabases:0" },
        { "Dashboard:WeeklyDatabases", "[\"other.db\", \"data/loopwatch.db\"]", "Dashboard:WeeklyDatabases:1" }, // this agent's own file (DataDir "data")
        { "DataDir", "\" \"", "DataDir" },
        { "Sparkplug:RequestRebirth", "\"maybe\"", "Sparkplug:RequestRebirth" },
        { "Sparkplug:RebirthMinSeconds", "0.5", "Sparkplug:RebirthMinSeconds" },
        { "Shard:Index", "3", "Shard:Index" }, // Count is 1 by default
        { "Shard:Count", "0", "Shard:Count" },
        { "Valves:ServiceAfterReversals", "0", "Valves:ServiceAfterReversals" },
        { "Valves:ServiceAfterStrokes", "0", "Valves:ServiceAfterStrokes" },
        { "Valves:SaveEverySeconds", "0.5", "Valves:SaveEverySeconds" },
        { "AlarmSystem:HealthNamespace", "\"plant/+\"", "AlarmSystem:HealthNamespace" },
        { "AlarmSystem:HealthNamespace", "\"a\"", "AlarmSystem:HealthNamespace" }, // overlaps the loop tag a/pv
        { "AlarmSystem:PublishHealth", "\"often\"", "AlarmSystem:PublishHealth" },
        { "AlarmSystem:HealthIntervalSeconds", "0.5", "AlarmSystem:HealthIntervalSeconds" },
        { "AlarmSystem:RetentionDays", "0", "AlarmSystem:RetentionDays" },
        { "Loops", "[]", "Loops" },
        { "Loops:0:Id", "\"\"", "Loops:0: Id" },
        { "Loops:0:Kind", "\"cascade-ish\"", "Loops:0 (FIC-101): Kind" },
        { "Loops:0:Process", "\"viscosity\"", "Loops:0 (FIC-101): Process" },
        { "Loops:0:Pv:Tag", "\"\"", "Loops:0 (FIC-101): Pv:Tag" },
        { "Loops:0:Pv:Min", "\"lots\"", "Loops:0:Pv:Min" },
        { "Loops:0:Pv:Max", "0", "Loops:0 (FIC-101): Pv:Max" },
        { "Loops:0:Sp:Tag", "\"\"", "Loops:0 (FIC-101): Sp:Tag" },
        { "Loops:0:Op:Tag", "\"a/pv\"", "Loops:0 (FIC-101): Op:Tag" },
        { "Loops:0:Mode:Tag", "\"a/sp\"", "Loops:0 (FIC-101): Mode:Tag" },
        { "Loops:0:Position:Tag", "\"a/op\"", "Loops:0 (FIC-101): Position:Tag" },
        { "Loops:0:Limits:OffsetPct", "-1", "Loops:0 (FIC-101): Limits:OffsetPct" },
        { "Loops:0:Limits:OffsetMinSeconds", "0", "Loops:0 (FIC-101): Limits:OffsetMinSeconds" },
        { "Loops:0:Limits:MaxStartsPerHour", "0", "Loops:0 (FIC-101): Limits:MaxStartsPerHour" },
        { "Loops:0:Limits:MaxReversalsPerHour", "-5", "Loops:0 (FIC-101): Limits:MaxReversalsPerHour" },
        { "Loops:0:Limits:ReversalDeadbandPct", "50", "Loops:0 (FIC-101): Limits:ReversalDeadbandPct" },
        { "Loops:0:Limits:OscillationAmplitudePct", "0", "Loops:0 (FIC-101): Limits:OscillationAmplitudePct" },
        { "Loops:0:Limits:StaleSeconds", "0.5", "Loops:0 (FIC-101): Limits:StaleSeconds" }, // shorter than SampleSeconds (1)
        { "Loops:0:Limits:SampleSeconds", "0", "Loops:0 (FIC-101): Limits:SampleSeconds" },
        { "Loops:0:Tuning:Kc", "0", "Loops:0 (FIC-101): Tuning:Kc" },
        { "Loops:0:Tuning:PbPct", "-10", "Loops:0 (FIC-101): Tuning:PbPct" },
        { "Loops:0:Tuning:TiSeconds", "0", "Loops:0 (FIC-101): Tuning:TiSeconds" },
        { "Loops:0:Tuning:TdSeconds", "-1", "Loops:0 (FIC-101): Tuning:TdSeconds" },
        { "Loops:0:Tuning:DeadTimeSeconds", "0", "Loops:0 (FIC-101): Tuning:DeadTimeSeconds" },
        { "Loops:0:Tuning:TimeConstantSeconds", "0", "Loops:0 (FIC-101): Tuning:TimeConstantSeconds" },
        { "Loops:0:Alarms:DeadbandPct", "50", "Loops:0 (FIC-101): Alarms:DeadbandPct" },
        { "Loops:0:Alarms:OnDelaySeconds", "-1", "Loops:0 (FIC-101): Alarms:OnDelaySeconds" },
        { "Loops:0:Alarms:OffDelaySeconds", "-1", "Loops:0 (FIC-101): Alarms:OffDelaySeconds" },
        { "Loops:0:Alarms:Priorities", """{ "oscillation": "urgent" }""", "Loops:0 (FIC-101): Alarms:Priorities:oscillation" },
        { "Loops:0:Alarms:Priorities", """{ "wobble": "low" }""", "Loops:0 (FIC-101): Alarms:Priorities:wobble" },
        { "Loops:0:Alarms:ActiveWhen", """["25:00-26:00"]""", "Loops:0 (FIC-101): Alarms:ActiveWhen:0" },
        { "Loops:0:Alarms:TimeZone", "\"Mars/Olympus\"", "Loops:0 (FIC-101): Alarms:TimeZone" },
    };

    /// <summary>Keys where any value of the right type is valid (free text, switches, unused signal ranges); a wrong type still exits 2 naming the key.</summary>
    private static readonly HashSet<string> AnyTypedValue =
    [
        "Broker:Username", "Loops:0:Description", "Loops:0:Area",
        "Loops:0:Pv:Unit", "Loops:0:Sp:Min", "Loops:0:Sp:Max", "Loops:0:Sp:Unit", "Loops:0:Op:Min", "Loops:0:Op:Max", "Loops:0:Op:Unit",
        "Loops:0:Mode:Min", "Loops:0:Mode:Max", "Loops:0:Mode:Unit", "Loops:0:Position:Min", "Loops:0:Position:Max", "Loops:0:Position:Unit",
    ];

    [Theory]
    [MemberData(nameof(Invalid))]
    public async Task An_invalid_value_exits_2_naming_the_key(string key, string json, string named)
    {
        var (code, err) = await Check(With(key, json));
        Assert.Equal(2, code);
        Assert.Contains(named, err);
    }

    public static TheoryData<string> NumericKeys() => [.. Keys().Where(k => k.Type != typeof(string)).Select(k => k.Path)];

    [Theory]
    [MemberData(nameof(NumericKeys))]
    public async Task A_value_of_the_wrong_type_exits_2_naming_the_key(string key)
    {
        var (code, err) = await Check(With(key, "\"lots\""));
        Assert.Equal(2, code);
        Assert.Contains(key, err);
    }

    [Fact]
    public void Every_key_of_the_configuration_has_an_invalid_case_or_accepts_any_value_of_its_type()
    {
        var covered = Invalid().Select(row => (string)row[0]).Concat(AnyTypedValue).ToHashSet();
        var missing = Keys().Select(k => k.Path).Where(p => !covered.Contains(p) && !covered.Any(c => p.StartsWith(c + ":", StringComparison.Ordinal))).ToList();
        Assert.True(missing.Count == 0, "keys without an invalid case: " + string.Join(", ", missing));
        // The reflection walk sees the whole tree, not a part of it.
        Assert.True(Keys().Count() > 50, $"{Keys().Count()} keys");
    }

    private static IEnumerable<(string Path, Type Type)> Keys() => Walk(typeof(AgentOptions), "");

    private static IEnumerable<(string Path, Type Type)> Walk(Type type, string prefix)
    {
        foreach (var p in type.GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => p.CanWrite))
        {
            var path = prefix + p.Name;
            var t = Nullable.GetUnderlyingType(p.PropertyType) ?? p.PropertyType;
            if (t == typeof(List<LoopOptions>))
            {
                yield return (path, t);
                foreach (var k in Walk(typeof(LoopOptions), path + ":0:")) yield return k;
            }
            else if (t.IsClass && t != typeof(string) && !t.IsGenericType)
            {
                foreach (var k in Walk(t, path + ":")) yield return k;
            }
            else if (!t.IsGenericType)
            {
                yield return (path, t);
            }
            else
            {
                yield return (path, typeof(string)); // lists and maps of text: covered by their own cases
            }
        }
    }

    private static string With(string key, string json)
    {
        var root = JsonNode.Parse(Good)!;
        JsonNode node = root["LoopWatch"]!;
        var parts = key.Split(':');
        for (var i = 0; i < parts.Length - 1; i++)
        {
            var part = parts[i];
            if (int.TryParse(part, out var index)) { node = node[index]!; continue; }
            node[part] ??= new JsonObject();
            node = node[part]!;
        }
        node[parts[^1]] = JsonNode.Parse(json);
        return root.ToJsonString();
    }

    private static Task<(int Code, string Err)> Check(string json) => ConfigurationErrorTests.Check(json);
}

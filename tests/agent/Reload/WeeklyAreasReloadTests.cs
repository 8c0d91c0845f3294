using System.Text.Json.Nodes;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Dashboard.Reports;

namespace LoopWatch.Agent.Tests.Reload;

/// <summary>The merged weekly page places other shards' loops by the configuration as reloaded, not as started.</summary>
public sealed class WeeklyAreasReloadTests
{
    [Fact]
    public async Task A_loop_of_another_shard_moved_to_another_area_is_counted_there_after_a_reload()
    {
        var ids = new[] { "FIC-980", "PIC-981", "LIC-982", "TIC-983", "FIC-984" };
        var mine = ids.First(i => LoopWatch.Agent.Configuration.ShardOptions.ShardOf(i, 2) == 0);
        var theirs = ids.First(i => LoopWatch.Agent.Configuration.ShardOptions.ShardOf(i, 2) == 1);
        LoopOptions Loop(string id, string area)
        {
            var o = TestLoops.Pid(id);
            o.Area = area;
            return o;
        }
        var week = ReportWeek.LastComplete(DateTimeOffset.UtcNow, TimeZoneInfo.Utc).Before();
        var h0 = week.Start.ToUnixTimeMilliseconds();

        // The other shard's database: 10 hours of its loop, 4 of them with an offset.
        var dir = Directory.CreateTempSubdirectory("lw-weekly-reload-").FullName;
        var other = Path.Combine(dir, "shard-1", "loopwatch.db");
        await ShardDatabase.WriteAsync(other, theirs, h0, hours: 10, offsetHours: 4);

        var port = FreePort.Next();
        string Config(string southArea)
        {
            var node = JsonNode.Parse(ConfigFile.Text(port, "http://127.0.0.1:0", [Loop(mine, "North yard"), Loop(theirs, southArea)]))!;
            var lw = node["LoopWatch"]!;
            lw["Broker"]!["Embedded"] = true;
            lw["Dashboard"]!["WeeklyDatabases"] = new JsonArray(other);
            lw["Shard"] = new JsonObject { ["Index"] = 0, ["Count"] = 2 };
            return node.ToJsonString();
        }
        var config = Path.Combine(dir, "conf", "loopwatch.json");
        Directory.CreateDirectory(Path.GetDirectoryName(config)!);
        await File.WriteAllTextAsync(config, Config("South yard"));
        var logs = new LogCapture();
        await using var agent = await RunningAgent.StartFromFileAsync(config, Path.Combine(dir, "data"), logs);

        async Task<string> WeeklyAsync() => await agent.Http.GetStringAsync("/weekly?week=" + week.Key);
        // Hand count: 6 of the other shard's 10 hours healthy, 60.0 %, in the area the file names.
        var page = await WeeklyAsync();
        Assert.Contains("data-area=\"South yard\"", page);
        Assert.DoesNotContain("South tank farm", page);

        await ConfigFile.WriteAsync(config, Config("South tank farm"));
        await Eventually.Until(() => Task.FromResult(logs.Lines), lines => lines.Any(l => l.EventId == 4710), what: "reload applied");
        page = await WeeklyAsync();
        Assert.Contains("data-area=\"South tank farm\"", page);
        Assert.DoesNotContain("South yard", page);
        var row = page[page.IndexOf("data-area=\"South tank farm\"", StringComparison.Ordinal)..];
        Assert.Contains("60.0 %", row[..row.IndexOf("</tr>", StringComparison.Ordinal)]);
    }
}

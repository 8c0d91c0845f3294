using System.Text;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Configuration;

public sealed class ShardTests
{
    // FNV-1a 32-bit test vectors of Fowler, Noll and Vo (IETF draft-eastlake-fnv, test vectors; values from memory).
    [Theory]
    [InlineData("", 0x811c9dc5u)]
    [InlineData("a", 0xe40c292cu)]
    [InlineData("foobar", 0xbf9cf968u)]
    public void Fnv1a32_matches_the_published_test_vectors(string text, uint expected) =>
        Assert.Equal(expected, ShardOptions.Fnv1a32(Encoding.UTF8.GetBytes(text)));

    [Fact]
    public void Every_loop_falls_in_exactly_one_shard_and_the_shards_are_not_lopsided()
    {
        var ids = Enumerable.Range(0, 3000).Select(i => $"FIC-{i:D5}").ToList();
        var shards = Enumerable.Range(0, 3).Select(i => new ShardOptions { Index = i, Count = 3 }).ToList();
        foreach (var id in ids) Assert.Single(shards, s => s.Takes(id));
        // A uniform hash puts 1000 +- 3 sigma (sigma = sqrt(3000 * 1/3 * 2/3) = 25.8) in each shard (binomial, textbook).
        foreach (var s in shards) Assert.InRange(ids.Count(s.Takes), 1000 - 78, 1000 + 78);
    }

    [Fact]
    public void The_check_keeps_only_the_agents_own_loops()
    {
        var options = new AgentOptions { Shard = new ShardOptions { Index = 1, Count = 2 } };
        options.Loops.AddRange(Enumerable.Range(0, 20).Select(i => TestLoops.Pid($"FIC-{i:D3}")));
        var errors = new List<string>();
        var specs = AgentOptionsCheck.Check(options, errors);
        Assert.Empty(errors);
        Assert.NotEmpty(specs);
        Assert.All(specs, s => Assert.Equal(1, ShardOptions.ShardOf(s.Id, 2)));
        Assert.Equal(options.Loops.Count(l => ShardOptions.ShardOf(l.Id!, 2) == 1), specs.Count);
    }

    [Theory]
    [InlineData(0, 0, "Shard:Count")]
    [InlineData(2, 2, "Shard:Index")]
    [InlineData(-1, 2, "Shard:Index")]
    public async Task A_shard_outside_the_count_exits_2_naming_the_key(int index, int count, string key)
    {
        var file = Path.Combine(Directory.CreateTempSubdirectory("lw-cfg-").FullName, "loops.json");
        await File.WriteAllTextAsync(file, $$"""
            { "LoopWatch": { "Shard": { "Index": {{index}}, "Count": {{count}} }, "Loops": [ { "Id": "FIC-101", "Kind": "pid", "Process": "flow",
                "Pv": { "Tag": "a/pv", "Min": 0, "Max": 250 }, "Sp": { "Tag": "a/sp" }, "Op": { "Tag": "a/op" } } ] } }
            """);
        var err = new StringWriter();
        Assert.Equal(2, await Cli.RunAsync(["check", "--config", file], new StringWriter(), err));
        Assert.Contains(key, err.ToString());
    }
}

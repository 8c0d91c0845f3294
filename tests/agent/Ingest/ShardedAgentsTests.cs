using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Tests.Infrastructure;
using Microsoft.Extensions.DependencyInjection;
using MQTTnet;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Tests.Ingest;

public sealed class ShardedAgentsTests
{
    [Fact]
    public async Task Two_agents_on_one_mosquitto_share_the_loops_each_taking_every_message_of_its_own_once()
    {
        const int Loops = 40, ValuesPerTag = 5;
        var loops = Enumerable.Range(0, Loops).Select(i => TestLoops.Pid($"FIC-{i:D3}", "shard")).ToList();
        await using var broker = await Mosquitto.StartAsync();
        await using var a = await RunningAgent.StartAsync(loops, embedded: false, broker.Port, tweak: o => o.Shard = new ShardOptions { Index = 0, Count = 2 });
        await using var b = await RunningAgent.StartAsync(loops, embedded: false, broker.Port, tweak: o => o.Shard = new ShardOptions { Index = 1, Count = 2 });
        var agents = new[] { a, b };
        foreach (var agent in agents)
            await agent.UntilSubscribedAsync();

        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", broker.Port).WithClientId("shard-test-publisher").Build());
        for (var s = 0; s < ValuesPerTag; s++)
            foreach (var loop in loops)
                foreach (var tag in new[] { loop.Pv!.Tag!, loop.Sp!.Tag!, loop.Op!.Tag! })
                    await client.PublishAsync(new MqttApplicationMessageBuilder().WithTopic(tag).WithPayload($"{50 + s}")
                        .WithQualityOfServiceLevel(MqttQualityOfServiceLevel.AtLeastOnce).Build());

        var plants = agents.Select(x => x.App.Services.GetRequiredService<PlantState>()).ToArray();
        const int Published = Loops * 3 * ValuesPerTag;
        await Eventually.Until(() => Task.FromResult(plants.Sum(p => p.Counters().Received)), n => n >= Published, what: "every message received by one agent");

        Assert.All(plants, p => Assert.NotEmpty(p.Cells)); // both agents got a share
        foreach (var loop in loops)
        {
            var owners = plants.Where(p => p.Cell(loop.Id!) is not null).ToList();
            var owner = Assert.Single(owners); // handled by exactly one agent
            Assert.Same(plants[ShardOptions.ShardOf(loop.Id!, 2)], owner); // the one the documented hash names
            foreach (var tag in new[] { loop.Pv!.Tag!, loop.Sp!.Tag!, loop.Op!.Tag! })
                Assert.Equal(ValuesPerTag, Interlocked.Read(ref owner.Routes[tag].Accepted)); // nothing lost, nothing doubled
        }
        foreach (var p in plants)
        {
            var c = p.Counters();
            Assert.Equal(0, c.UnknownTopic); // subscribed to its own loops' topics only
            Assert.Equal(p.Cells.Count * 3 * ValuesPerTag, c.Received);
        }
        Assert.Equal(Published, plants.Sum(p => p.Counters().Received));
    }
}

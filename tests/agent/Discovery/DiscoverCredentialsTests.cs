using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Discovery;

/// <summary>Discover with broker credentials from LOOPWATCH__BROKER__ variables, held for the whole run.</summary>
[Collection(AloneCollection.Name)]
public sealed class DiscoverCredentialsTests
{
    [Fact]
    public async Task Discover_takes_broker_credentials_from_the_environment_and_without_them_is_refused()
    {
        var password = $"pw-{Guid.NewGuid():N}";
        var port = FreePort.Next();
        // The embedded broker of a running agent requires these credentials and carries the agent's retained health topics.
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-151")], embedded: true, brokerPort: port,
            tweak: o => { o.Broker.Username = "quillmoor-survey"; o.Broker.Password = password; });
        await agent.UntilSubscribedAsync();

        var denied = new StringWriter();
        Assert.Equal(1, await Cli.RunAsync(["discover", "--broker", $"127.0.0.1:{port}", "--seconds", "1"], new StringWriter(), denied));
        Assert.Contains("unreachable", denied.ToString());

        Environment.SetEnvironmentVariable("LOOPWATCH__BROKER__USERNAME", "quillmoor-survey");
        Environment.SetEnvironmentVariable("LOOPWATCH__BROKER__PASSWORD", password);
        var err = new StringWriter();
        int code;
        try
        {
            code = await Cli.RunAsync(["discover", "--broker", $"127.0.0.1:{port}", "--seconds", "1.5"], new StringWriter(), err);
        }
        finally
        {
            Environment.SetEnvironmentVariable("LOOPWATCH__BROKER__PASSWORD", null);
            Environment.SetEnvironmentVariable("LOOPWATCH__BROKER__USERNAME", null);
        }
        Assert.True(code == 0, err.ToString());
        Assert.Contains($"listening to 127.0.0.1:{port} for", err.ToString());
        Assert.DoesNotContain(password, err.ToString() + denied);
    }
}

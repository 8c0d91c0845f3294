using System.Net.Sockets;
using System.Text;
using System.Text.Json;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Service;

/// <summary>
/// The real program as systemd starts a Type=notify unit: NOTIFY_SOCKET names a unix datagram socket, SYSTEMD_EXEC_PID the
/// main process (systemd v248 and later set both). sd_notify(3): the service sends READY=1 when started and STOPPING=1 on stop.
/// </summary>
public sealed class SystemdNotifyTests
{
    [Fact]
    public async Task Under_systemd_the_agent_sends_READY_then_STOPPING_and_JSON_console_lines_are_valid_JSON()
    {
        await using var broker = await Mosquitto.StartAsync();
        var dashboard = $"http://127.0.0.1:{FreePort.Next()}";
        var (agent, socket) = await StartUnderSystemdAsync(broker, dashboard, "FIC-950", new() { ["Logging__Console__FormatterName"] = "json" });
        await using var stopAgent = agent;
        using var closeSocket = socket;

        var ready = await ReceiveAsync(socket, agent);
        Assert.Contains("READY=1", ready.Split('\n'));
        // READY means started: the dashboard answers at once, without waiting.
        using var http = new HttpClient { BaseAddress = new Uri(dashboard) };
        Assert.True((await http.GetAsync("/healthz")).IsSuccessStatusCode);

        await agent.TerminateAsync();
        var stopping = await ReceiveAsync(socket, agent);
        Assert.Contains("STOPPING=1", stopping.Split('\n'));
        Assert.True(await agent.WaitForExitAsync(TimeSpan.FromSeconds(60)), "the agent did not stop after SIGTERM");
        Assert.Equal(0, agent.ExitCode);

        var lines = agent.Stdout.Where(l => l.Length > 0).ToList();
        Assert.NotEmpty(lines);
        var eventIds = new List<int>();
        foreach (var line in lines)
        {
            using var doc = JsonDocument.Parse(line); // throws on any line that is not one JSON object
            var e = doc.RootElement;
            Assert.Equal(JsonValueKind.Object, e.ValueKind);
            Assert.True(e.TryGetProperty("LogLevel", out _), line);
            Assert.True(e.TryGetProperty("Message", out _), line);
            eventIds.Add(e.GetProperty("EventId").GetInt32());
        }
        Assert.Contains(4701, eventIds); // the structured "started" line stands in for the human banner
    }

    [Fact]
    public async Task Under_systemd_without_a_configured_formatter_the_console_uses_the_journal_priority_prefix()
    {
        await using var broker = await Mosquitto.StartAsync();
        var (agent, socket) = await StartUnderSystemdAsync(broker, $"http://127.0.0.1:{FreePort.Next()}", "FIC-951", []);
        await using var stopAgent = agent;
        using var closeSocket = socket;
        Assert.Contains("READY=1", (await ReceiveAsync(socket, agent)).Split('\n'));
        await agent.TerminateAsync();
        Assert.True(await agent.WaitForExitAsync(TimeSpan.FromSeconds(60)), "the agent did not stop after SIGTERM");

        // sd-daemon(3): a line starting "<6>" is logged by journald at priority 6 (info); no human banner in between.
        var lines = agent.Stdout.Where(l => l.Length > 0).ToList();
        Assert.Contains(lines, l => l.StartsWith("<6>", StringComparison.Ordinal) && l.Contains("started"));
        Assert.All(lines, l => Assert.Matches("^<[0-7]>", l));
    }

    /// <summary>A notify socket bound in a temp folder and <c>loopwatch run</c> started as systemd's main process with NOTIFY_SOCKET naming it.</summary>
    private static async Task<(AgentProcess Agent, Socket Socket)> StartUnderSystemdAsync(Mosquitto broker, string dashboard, string loopId,
        Dictionary<string, string> environment)
    {
        var dir = Directory.CreateTempSubdirectory("lw-notify-").FullName;
        var socketPath = Path.Combine(dir, "notify.sock");
        var socket = new Socket(AddressFamily.Unix, SocketType.Dgram, ProtocolType.Unspecified);
        socket.Bind(new UnixDomainSocketEndPoint(socketPath));
        var config = Path.Combine(dir, "loopwatch.json");
        await File.WriteAllTextAsync(config, ConfigFile.Text(broker.Port, dashboard, [TestLoops.Pid(loopId)]));
        environment["NOTIFY_SOCKET"] = socketPath;
        var agent = AgentProcess.Start(["run", "--config", config, "--data-dir", Path.Combine(dir, "data")], environment, asSystemdMain: true);
        return (agent, socket);
    }

    private static async Task<string> ReceiveAsync(Socket socket, AgentProcess agent)
    {
        var buffer = new byte[4096];
        // A cold dotnet start on a loaded 2-core machine: a generous bound, but a bound.
        using var cts = new CancellationTokenSource(TimeSpan.FromSeconds(90));
        try
        {
            var n = await socket.ReceiveAsync(buffer, SocketFlags.None, cts.Token);
            return Encoding.UTF8.GetString(buffer, 0, n);
        }
        catch (OperationCanceledException)
        {
            throw new TimeoutException($"no notification from the agent (exited: {agent.HasExited}); stderr: {string.Join('\n', agent.Stderr)}; stdout: {string.Join('\n', agent.Stdout.TakeLast(20))}");
        }
    }
}

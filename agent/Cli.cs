using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Demo;
using LoopWatch.Agent.Plant;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent;

/// <summary>Parses the verb and dispatches: <c>demo</c>, <c>run</c>, <c>check</c>, <c>analyze</c>, <c>user</c>, <c>report</c>, <c>bench</c>.</summary>
public static class Cli
{
    private const string Usage = """
        usage:
          loopwatch demo  [--speed N] [--data-dir DIR] [--config FILE]   simulated plant through the real agent
          loopwatch run   --config FILE [--data-dir DIR]                  watch the loops the configuration names
          loopwatch check --config FILE                                   check a configuration and exit
          loopwatch analyze --config FILE [--format text|json|csv|html] [--out FILE] [--from T] [--to T] [--strict] FILE...
                                                                          historian CSV files through the same analytics
          loopwatch discover [--broker HOST:PORT] [--config FILE] [--seconds 30] [--out FILE]
                                                                          listen and propose a configuration to review
          loopwatch user add NAME --role viewer|operator|maintenance|admin [--data-dir DIR]   add a dashboard user
          loopwatch report weekly --db FILE [--db FILE...] [--week YYYY-MM-DD] [--config FILE] [--format text|csv]
                                                                          plant-wide weekly figures from one or more agents' databases
          loopwatch bench [--loops N] [--rate R] [--seconds S] [--in-process] [--broker HOST:PORT]
                                                                          measure capacity on this machine (table, then JSON)
        """;

    /// <summary>Runs one verb to completion; 0 ok, 1 runtime failure, 2 usage or configuration error.</summary>
    public static async Task<int> RunAsync(string[] args, TextWriter stdout, TextWriter stderr, CancellationToken stop = default, TextReader? stdin = null)
    {
        if (args.Length == 0 || args[0] is "-h" or "--help" or "help") { stdout.WriteLine(Usage); return args.Length == 0 ? 2 : 0; }
        var errors = new List<string>();
        var verb = args[0];
        var cli = CliArguments.Parse(args.Skip(1), new HashSet<string>(), errors);
        switch (verb)
        {
            case "demo":
            case "run":
            case "check":
                return await RunAgentAsync(verb, cli, errors, stdout, stderr, stop);
            case "analyze":
                return Analyze.AnalyzeCommand.Run(args.Skip(1), stdout, stderr);
            case "discover":
                return await Discovery.DiscoverCommand.RunAsync(cli, errors, stdout, stderr, TimeProvider.System, stop);
            case "report":
                return await Report.ReportCommand.RunAsync(args.Skip(1), stdout, stderr, TimeProvider.System, stop);
            case "bench":
                return await Bench.BenchCommand.RunAsync(args.Skip(1), stdout, stderr, stop);
            case "user":
                return await UserVerb.RunAsync(cli, errors, stdin ?? Console.In, stdout, stderr);
            default:
                stderr.WriteLine($"loopwatch: unknown verb '{verb}'");
                stderr.WriteLine(Usage);
                return 2;
        }
    }

    private static async Task<int> RunAgentAsync(string verb, CliArguments cli, List<string> errors, TextWriter stdout, TextWriter stderr, CancellationToken stop)
    {
        var demo = verb == "demo";
        var configFile = cli.Get("config");
        if (!demo && configFile is null) errors.Add("--config: is required");
        var speed = demo ? cli.Number("speed", 1, errors) : 1;
        var overrides = new Dictionary<string, string?>();
        if (cli.Get("data-dir") is { } dir) overrides["LoopWatch:DataDir"] = dir;
        foreach (var unused in cli.Unused()) errors.Add($"--{unused}: unknown option for '{verb}'");
        if (cli.Operands.Count > 0) errors.Add($"unexpected argument '{cli.Operands[0]}'");

        AgentOptions? seed = null;
        if (demo)
        {
            seed = new AgentOptions { Broker = new BrokerOptions { Embedded = true } };
            seed.Loops.AddRange(new DemoPlant().Configuration);
        }
        Microsoft.Extensions.Configuration.IConfiguration? logging = null;
        var options = errors.Count == 0 ? AgentConfiguration.Load(configFile, overrides, errors, seed, out logging) : new AgentOptions();
        var specs = errors.Count == 0 ? AgentOptionsCheck.Check(options, errors) : [];
        if (errors.Count > 0)
        {
            foreach (var e in errors) stderr.WriteLine($"loopwatch: {e}");
            return 2;
        }
        if (verb == "check")
        {
            stdout.WriteLine($"configuration ok: {specs.Count} loops" + (options.Shard.Count > 1 ? $" in shard {options.Shard.Index} of {options.Shard.Count} ({options.Loops.Count} in all)" : ""));
            return 0;
        }

        var time = TimeProvider.System;
        var run = demo ? new DemoRun(speed, time.GetUtcNow()) : null;
        // Only `run` reloads its file: the demo's loops come from the simulator, not the file.
        var source = verb == "run" ? new ConfigurationSource(Path.GetFullPath(configFile!), overrides) : null;
        await using var app = AgentHost.Build(new AgentSetup(options, specs, run, time) { Logging = logging, Source = source });
        try
        {
            await app.StartAsync(stop);
        }
        catch (Exception e) when (e is IOException or System.Net.Sockets.SocketException || e.InnerException is System.Net.Sockets.SocketException)
        {
            stderr.WriteLine($"loopwatch: could not start: {e.Message}");
            return 1;
        }
        var b = options.Broker;
        var addresses = string.Join(", ", AgentHost.DashboardAddresses(app));
        Service.ServiceLog.Started(app.Services.GetRequiredService<ILoggerFactory>().CreateLogger("LoopWatch.Agent"), verb, specs.Count, b.Host, b.Port,
            addresses, Path.GetFullPath(options.DataDir));
        // The banner is for a person at a terminal; JSON or journal consoles get only the log line above.
        if (!Service.ServiceHosting.MachineReadConsole(logging)) PrintBanner(stdout, verb, specs.Count, options, addresses, demo ? speed : null);
        await app.WaitForShutdownAsync(stop);
        if (!Service.ServiceHosting.MachineReadConsole(logging)) stdout.WriteLine("LoopWatch stopped.");
        return 0;
    }

    private static void PrintBanner(TextWriter stdout, string verb, int loops, AgentOptions options, string addresses, double? speed)
    {
        var b = options.Broker;
        stdout.WriteLine($"LoopWatch {verb}: {loops} loops" + (options.Shard.Count > 1 ? $" (shard {options.Shard.Index} of {options.Shard.Count})" : ""));
        stdout.WriteLine($"  MQTT broker : mqtt://{b.Host}:{b.Port}{(b.Embedded ? " (embedded)" : "")}");
        stdout.WriteLine($"  dashboard   : {addresses}");
        stdout.WriteLine($"  data folder : {Path.GetFullPath(options.DataDir)}");
        if (speed is { } x) stdout.WriteLine($"  demo plant  : Quillmoor Works at {x}x");
        stdout.WriteLine("Press Ctrl+C to stop.");
    }
}

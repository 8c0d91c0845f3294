using System.Globalization;
using LoopWatch.Agent.Configuration;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// <c>loopwatch bench [--loops N] [--rate R] [--seconds S] [--in-process] [--broker host:port]</c>: measures the agent
/// on this machine, prints a table and then one line of JSON. Exit 0 measured, 1 failed, 2 usage error.
/// </summary>
public static class BenchCommand
{
    /// <summary>The usage line of the verb.</summary>
    public const string Usage = "loopwatch bench [--loops N] [--rate R] [--seconds S] [--in-process] [--broker HOST:PORT]";

    /// <summary>Runs the verb on its arguments (after the word <c>bench</c>).</summary>
    public static async Task<int> RunAsync(IEnumerable<string> args, TextWriter stdout, TextWriter stderr, CancellationToken stop)
    {
        var errors = new List<string>();
        var cli = CliArguments.Parse(args, new HashSet<string> { "in-process" }, errors);
        var loops = cli.Number("loops", 10_000, errors);
        if (loops != Math.Floor(loops) || loops > 1_000_000) errors.Add($"--loops: {loops} is not a whole number up to 1,000,000");
        double? rate = cli.Get("rate") is null ? null : cli.Number("rate", 1, errors);
        var seconds = cli.Number("seconds", 30, errors);
        var inProcess = cli.Flag("in-process");
        string? host = null;
        var port = 0;
        if (cli.Get("broker") is { } broker)
        {
            var colon = broker.LastIndexOf(':');
            if (colon <= 0 || !int.TryParse(broker[(colon + 1)..], NumberStyles.None, CultureInfo.InvariantCulture, out port) || port is < 1 or > 65535)
                errors.Add($"--broker: '{broker}' is not HOST:PORT");
            else host = broker[..colon];
        }
        if (inProcess && (rate is not null || host is not null)) errors.Add("--in-process: takes neither --rate nor --broker (no MQTT is involved)");
        foreach (var unused in cli.Unused()) errors.Add($"--{unused}: unknown option for 'bench'");
        if (cli.Operands.Count > 0) errors.Add($"unexpected argument '{cli.Operands[0]}'");
        var options = new BenchOptions((int)loops, rate, seconds, inProcess, host, port);
        var loopOptions = BenchPlant.Loops(options.Loops);
        var check = new AgentOptions();
        check.Loops.AddRange(loopOptions);
        var specs = errors.Count == 0 ? AgentOptionsCheck.Check(check, errors) : [];
        if (errors.Count > 0)
        {
            foreach (var e in errors) stderr.WriteLine($"loopwatch bench: {e}");
            stderr.WriteLine($"usage: {Usage}");
            return 2;
        }

        await using var gauge = new ProcessGauge();
        BenchResult result;
        try
        {
            result = inProcess
                ? InProcessBench.Run(options, specs, gauge)
                : await MqttBench.RunAsync(options, loopOptions, gauge, stderr, stop);
        }
        catch (Exception e) when (e is IOException or System.Net.Sockets.SocketException or TimeoutException or InvalidOperationException
            or MQTTnet.Exceptions.MqttCommunicationException)
        {
            stderr.WriteLine($"loopwatch bench: failed: {e.Message}");
            return 1;
        }
        result.WriteTable(stdout, LoadAverage());
        stdout.WriteLine(result.JsonLine());
        return 0;
    }

    // The machine's load, so a figure can be read against what else was running.
    private static string LoadAverage()
    {
        try
        {
            var parts = File.ReadAllText("/proc/loadavg").Split(' ');
            return $"{parts[0]}, {parts[1]}, {parts[2]} on {Environment.ProcessorCount} cores";
        }
        catch (IOException) { return "unknown"; }
        catch (UnauthorizedAccessException) { return "unknown"; }
    }
}

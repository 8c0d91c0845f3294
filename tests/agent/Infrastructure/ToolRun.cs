using System.Diagnostics;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Runs a command-line tool of the machine (installed by ./test.sh) to its end.</summary>
public static class ToolRun
{
    /// <summary>The tool's exit code and what it wrote to stdout and stderr, both read as it runs so neither pipe fills.</summary>
    public static async Task<(int ExitCode, string Output, string Error)> RunAsync(string tool, params string[] args)
    {
        using var p = Process.Start(new ProcessStartInfo(tool, args) { RedirectStandardError = true, RedirectStandardOutput = true, UseShellExecute = false })!;
        var output = p.StandardOutput.ReadToEndAsync();
        var error = p.StandardError.ReadToEndAsync();
        await p.WaitForExitAsync();
        return (p.ExitCode, await output, await error);
    }
}

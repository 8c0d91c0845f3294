using System.Collections.Concurrent;
using System.Diagnostics;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// The real <c>loopwatch</c> program started as a child process (the built loopwatch.dll under the dotnet host), with
/// its console lines captured; used where the process boundary matters (service managers, signals, console format).
/// </summary>
public sealed class AgentProcess : IAsyncDisposable
{
    private readonly Process _process;
    private readonly ConcurrentQueue<string> _stdout = new();
    private readonly ConcurrentQueue<string> _stderr = new();

    private AgentProcess(Process process)
    {
        _process = process;
        process.OutputDataReceived += (_, e) => { if (e.Data is not null) _stdout.Enqueue(e.Data); };
        process.ErrorDataReceived += (_, e) => { if (e.Data is not null) _stderr.Enqueue(e.Data); };
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
    }

    public int Id => _process.Id;
    public IReadOnlyList<string> Stdout => _stdout.ToArray();
    public IReadOnlyList<string> Stderr => _stderr.ToArray();
    public bool HasExited => _process.HasExited;
    public int ExitCode => _process.ExitCode;

    /// <summary>The built agent next to the tests.</summary>
    public static string Dll => Path.Combine(AppContext.BaseDirectory, "loopwatch.dll");

    /// <summary>The dotnet host running the tests.</summary>
    public static string DotnetHost => Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } host && File.Exists(host) ? host
        : Environment.ProcessPath is { } p && Path.GetFileNameWithoutExtension(p) == "dotnet" ? p
        : "dotnet";

    /// <summary>
    /// Starts <c>loopwatch <paramref name="args"/></c> with the extra environment; with <paramref name="asSystemdMain"/> the process
    /// carries <c>SYSTEMD_EXEC_PID</c> = its own pid, as systemd (v248 and later) sets it for the main process of a unit.
    /// </summary>
    public static AgentProcess Start(IEnumerable<string> args, IReadOnlyDictionary<string, string> environment, bool asSystemdMain = false)
    {
        // sh sets the variable to its own pid and execs into the agent, which keeps that pid.
        var psi = asSystemdMain
            ? new ProcessStartInfo("/bin/sh", ["-c", "SYSTEMD_EXEC_PID=$$; export SYSTEMD_EXEC_PID; exec \"$@\"", "sh", DotnetHost, Dll, .. args])
            : new ProcessStartInfo(DotnetHost, [Dll, .. args]);
        psi.RedirectStandardOutput = true;
        psi.RedirectStandardError = true;
        psi.UseShellExecute = false;
        foreach (var name in new[] { "NOTIFY_SOCKET", "SYSTEMD_EXEC_PID", "LISTEN_PID", "INVOCATION_ID" }) psi.Environment.Remove(name);
        foreach (var (k, v) in environment) psi.Environment[k] = v;
        return new AgentProcess(Process.Start(psi) ?? throw new InvalidOperationException("loopwatch did not start"));
    }

    /// <summary>Sends SIGTERM, as systemd and docker stop a service.</summary>
    public async Task TerminateAsync()
    {
        using var kill = Process.Start(new ProcessStartInfo("kill", ["-TERM", Id.ToString()]) { UseShellExecute = false })!;
        await kill.WaitForExitAsync();
    }

    /// <summary>Waits for exit within <paramref name="timeout"/>; false when still running.</summary>
    public async Task<bool> WaitForExitAsync(TimeSpan timeout)
    {
        using var cts = new CancellationTokenSource(timeout);
        try { await _process.WaitForExitAsync(cts.Token); return true; }
        catch (OperationCanceledException) { return false; }
    }

    public async ValueTask DisposeAsync()
    {
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
            await _process.WaitForExitAsync();
        }
        _process.Dispose();
    }
}

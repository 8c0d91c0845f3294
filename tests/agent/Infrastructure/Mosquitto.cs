using System.Diagnostics;
using System.Net.Sockets;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// A real Mosquitto broker started for one test on a free loopback port. A missing mosquitto binary fails the test
/// (./test.sh installs it); it never skips.
/// </summary>
public sealed class Mosquitto : IAsyncDisposable
{
    private Process _process;
    private readonly string _dir;

    private Mosquitto(Process process, string dir, int port)
    {
        _process = process;
        _dir = dir;
        Port = port;
    }

    public int Port { get; }

    /// <summary>Arguments mosquitto_pub needs for this broker's listener (the CA and client certificate of a TLS listener).</summary>
    private string[] _clientArgs = [];

    public static string Binary => File.Exists("/usr/sbin/mosquitto") ? "/usr/sbin/mosquitto" : Which("mosquitto")
        ?? throw new InvalidOperationException("mosquitto is not installed: run ./test.sh, which installs the Debian package 'mosquitto'");

    public static string Tool(string name) => Which(name)
        ?? throw new InvalidOperationException($"{name} is not installed: run ./test.sh, which installs the Debian package 'mosquitto-clients'");

    /// <summary>Starts the broker and waits until it accepts connections; <paramref name="extraConfig"/> lines are appended.</summary>
    public static async Task<Mosquitto> StartAsync(int? port = null, string extraConfig = "")
    {
        var p = port ?? FreePort.Next();
        var dir = Directory.CreateTempSubdirectory("lw-mosquitto-").FullName;
        // Started as root, mosquitto drops to its own user, which must be able to write the persistence file here.
        if (!OperatingSystem.IsWindows()) File.SetUnixFileMode(dir, (UnixFileMode)0b111_111_111);
        var broker = new Mosquitto(await LaunchAsync(dir, p, extraConfig, listen: true), dir, p);
        await broker.WaitReadyAsync(p);
        return broker;
    }

    /// <summary>
    /// Starts the broker with one TLS listener only, on a free loopback port, serving <paramref name="server"/>. With
    /// <paramref name="requireCertificate"/> every client must show a certificate from <paramref name="pki"/>'s CA;
    /// mosquitto_pub then uses <paramref name="publisher"/>.
    /// </summary>
    public static async Task<Mosquitto> StartTlsAsync(TestPki pki, IssuedCertificate server, bool requireCertificate = false, IssuedCertificate? publisher = null)
    {
        var p = FreePort.Next();
        var dir = Directory.CreateTempSubdirectory("lw-mosquitto-").FullName;
        if (!OperatingSystem.IsWindows()) File.SetUnixFileMode(dir, (UnixFileMode)0b111_111_111);
        // Bound to loopback like every test listener; the options after "listener" belong to it.
        var tls = $"""
            listener {p} 127.0.0.1
            cafile {pki.CaFile}
            certfile {server.CertFile}
            keyfile {server.KeyFile}
            require_certificate {(requireCertificate ? "true" : "false")}
            """;
        var broker = new Mosquitto(await LaunchAsync(dir, p, tls, listen: false), dir, p)
        {
            _clientArgs = ["--cafile", pki.CaFile, .. publisher is null ? [] : new[] { "--cert", publisher.CertFile, "--key", publisher.KeyFile }],
        };
        await broker.WaitReadyAsync(p);
        return broker;
    }

    /// <summary>
    /// Starts the broker again after <see cref="Kill"/> or <see cref="StopAsync"/>, on the same port and persistence folder
    /// (so persistent sessions and their queued messages come back). Without <paramref name="listen"/> the main port
    /// stays closed and only the listeners in <paramref name="extraConfig"/> are open.
    /// </summary>
    public async Task RestartAsync(string extraConfig = "", bool listen = true, int readyPort = 0)
    {
        if (!_process.HasExited) throw new InvalidOperationException("mosquitto is still running");
        _process.Dispose();
        _process = await LaunchAsync(_dir, Port, extraConfig, listen);
        await WaitReadyAsync(readyPort == 0 ? Port : readyPort);
    }

    /// <summary>Waits until the broker has written its persistence file after <paramref name="sinceUtc"/> (it saves once a second).</summary>
    public async Task WaitSavedAsync(DateTime sinceUtc)
    {
        var file = Path.Combine(_dir, "mosquitto.db");
        await Eventually.Until(() => Task.FromResult(File.Exists(file) ? File.GetLastWriteTimeUtc(file) : DateTime.MinValue), t => t > sinceUtc,
            TimeSpan.FromSeconds(10), "mosquitto persistence written");
    }

    /// <summary>Stops the broker with SIGTERM, so it writes its persistence file, and waits for it to exit.</summary>
    public async Task StopAsync()
    {
        using (var kill = Process.Start(new ProcessStartInfo("kill", ["-TERM", _process.Id.ToString()]) { UseShellExecute = false })!)
            await kill.WaitForExitAsync();
        await _process.WaitForExitAsync();
    }

    private static async Task<Process> LaunchAsync(string dir, int port, string extraConfig, bool listen)
    {
        var conf = Path.Combine(dir, "mosquitto.conf");
        // autosave_interval 1: persistence written every second, so sessions survive even a SIGKILL.
        await File.WriteAllTextAsync(conf, $"""
            {(listen ? $"listener {port} 127.0.0.1" : "")}
            allow_anonymous true
            persistence true
            persistence_location {dir}/
            autosave_interval 1
            max_queued_messages 1000000
            {extraConfig}
            """);
        var psi = new ProcessStartInfo(Binary, ["-c", conf]) { RedirectStandardError = true, RedirectStandardOutput = true, UseShellExecute = false };
        var process = Process.Start(psi) ?? throw new InvalidOperationException("mosquitto did not start");
        process.BeginErrorReadLine();
        process.BeginOutputReadLine();
        return process;
    }

    /// <summary>Runs a mosquitto client tool (mosquitto_pub) against this broker and waits for it.</summary>
    public Task PublishAsync(string topic, string message, int qos = 0, bool retain = false) =>
        MosquittoPubAsync(["-t", topic, "-m", message, "-q", qos.ToString(), .. retain ? new[] { "-r" } : []]);

    /// <summary>Publishes the bytes of <paramref name="file"/> with mosquitto_pub -f (binary payloads such as Sparkplug).</summary>
    public Task PublishFileAsync(string topic, string file, bool retain = false) =>
        MosquittoPubAsync(["-t", topic, "-f", file, "-q", "1", .. retain ? new[] { "-r" } : []]);

    /// <summary>Runs mosquitto_sub for the first message (retained ones included) on <paramref name="topic"/>; "topic payload", or empty after <paramref name="waitSeconds"/>.</summary>
    public async Task<string> SubscribeOneAsync(string topic, int waitSeconds = 5)
    {
        var psi = new ProcessStartInfo(Tool("mosquitto_sub"), ["-h", "127.0.0.1", "-p", Port.ToString(), .. _clientArgs, "-C", "1", "-W", waitSeconds.ToString(), "-v", "-t", topic])
        { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        using var sub = Process.Start(psi)!;
        var output = sub.StandardOutput.ReadToEndAsync();
        var err = sub.StandardError.ReadToEndAsync();
        await sub.WaitForExitAsync();
        await err;
        return await output;
    }

    private async Task MosquittoPubAsync(string[] args)
    {
        var psi = new ProcessStartInfo(Tool("mosquitto_pub"), ["-h", "127.0.0.1", "-p", Port.ToString(), .. _clientArgs, .. args])
        { RedirectStandardError = true, UseShellExecute = false };
        using var pub = Process.Start(psi)!;
        var err = await pub.StandardError.ReadToEndAsync();
        await pub.WaitForExitAsync();
        if (pub.ExitCode != 0) throw new InvalidOperationException($"mosquitto_pub failed ({pub.ExitCode}): {err}");
    }

    /// <summary>Kills the broker at once (SIGKILL).</summary>
    public void Kill()
    {
        if (!_process.HasExited) _process.Kill();
        _process.WaitForExit();
    }

    private async Task WaitReadyAsync(int port)
    {
        var clock = System.Diagnostics.Stopwatch.StartNew();
        while (clock.Elapsed < TimeSpan.FromSeconds(10))
        {
            if (_process.HasExited) throw new InvalidOperationException($"mosquitto exited with {_process.ExitCode}");
            try
            {
                using var c = new TcpClient();
                await c.ConnectAsync("127.0.0.1", port);
                return;
            }
            catch (SocketException) { await Task.Delay(50); }
        }
        throw new TimeoutException("mosquitto did not accept connections within 10 s");
    }

    private static string? Which(string name) =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':').Append("/usr/sbin").Append("/usr/bin")
        .Select(d => Path.Combine(d, name)).FirstOrDefault(File.Exists);

    public async ValueTask DisposeAsync()
    {
        Kill();
        _process.Dispose();
        await Task.Yield();
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }
}

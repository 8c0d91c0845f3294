using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Service;

/// <summary>The shipped systemd unit: systemd's own verifier accepts it, it has the settings the README promises, and its ExecStart arguments pass <c>loopwatch check</c>.</summary>
public sealed class UnitFileTests
{
    private static string UnitPath => Path.Combine(RepositoryRoot.Path, "deploy", "loopwatch.service");
    private const string Binary = "/opt/loopwatch/loopwatch";

    /// <summary>Section -> key -> values (a key may repeat), as systemd.syntax(7) reads the file: '#' and ';' start comments.</summary>
    private static Dictionary<string, Dictionary<string, List<string>>> Parse(string text)
    {
        var sections = new Dictionary<string, Dictionary<string, List<string>>>(StringComparer.Ordinal);
        Dictionary<string, List<string>>? current = null;
        foreach (var raw in text.Split('\n'))
        {
            var line = raw.Trim();
            if (line.Length == 0 || line[0] is '#' or ';') continue;
            if (line[0] == '[') { sections[line.Trim('[', ']')] = current = new(StringComparer.Ordinal); continue; }
            Assert.NotNull(current); // every key sits in a section
            var eq = line.IndexOf('=');
            Assert.True(eq > 0, $"not a key=value line: {line}");
            var key = line[..eq].Trim();
            if (!current!.TryGetValue(key, out var values)) current[key] = values = [];
            values.Add(line[(eq + 1)..].Trim());
        }
        return sections;
    }

    [Fact]
    public void The_unit_runs_the_agent_as_a_notify_service_under_its_own_user_with_hardening()
    {
        var unit = Parse(File.ReadAllText(UnitPath));
        var service = unit["Service"];
        string One(string key) => Assert.Single(service[key]);
        Assert.Equal("notify", One("Type"));
        Assert.Equal("loopwatch", One("User"));
        Assert.Equal($"{Binary} run --config /etc/loopwatch/loopwatch.json --data-dir /var/lib/loopwatch", One("ExecStart"));
        Assert.Equal("loopwatch", One("StateDirectory"));
        Assert.Equal("on-failure", One("Restart"));
        Assert.Equal("2", One("RestartPreventExitStatus"));
        Assert.Equal("yes", One("NoNewPrivileges"));
        Assert.Equal("strict", One("ProtectSystem"));
        Assert.Equal("/var/lib/loopwatch", One("ReadWritePaths"));
        Assert.Equal("yes", One("PrivateTmp"));
        Assert.False(service.ContainsKey("MemoryDenyWriteExecute")); // would stop the .NET JIT
        Assert.Equal("multi-user.target", Assert.Single(unit["Install"]["WantedBy"]));
    }

    [Fact]
    public async Task Systemd_analyze_verify_accepts_the_unit_without_a_warning()
    {
        // verify insists that ExecStart's program exists; the rest of the file is verified unchanged.
        var dir = Directory.CreateTempSubdirectory("lw-unit-").FullName;
        var copy = Path.Combine(dir, "loopwatch.service");
        await File.WriteAllTextAsync(copy, (await File.ReadAllTextAsync(UnitPath)).Replace(Binary, "/bin/true"));
        var tool = new[] { "/usr/bin/systemd-analyze", "/bin/systemd-analyze" }.FirstOrDefault(File.Exists)
            ?? throw new InvalidOperationException("systemd-analyze is not installed: run ./test.sh, which installs the Debian package 'systemd'");
        var (exit, stdout, stderr) = await ToolRun.RunAsync(tool, "verify", copy);
        var output = stderr + stdout;
        Assert.Equal(0, exit);
        // Unknown keys and bad values are only warnings to systemd ("...service:12: Unknown key"), so no line may name the file.
        Assert.DoesNotContain("loopwatch.service", output);
    }

    [Fact]
    public async Task The_ExecStart_arguments_pass_loopwatch_check()
    {
        var unit = Parse(File.ReadAllText(UnitPath));
        var args = Assert.Single(unit["Service"]["ExecStart"]).Split(' ', StringSplitOptions.RemoveEmptyEntries).Skip(1).ToArray();
        Assert.Equal("run", args[0]);
        var dir = Directory.CreateTempSubdirectory("lw-unit-").FullName;
        var config = Path.Combine(dir, "loopwatch.json");
        await File.WriteAllTextAsync(config, ConfigFile.Text(1883, "http://127.0.0.1:5080", [TestLoops.Pid("FIC-960")]));
        // Same options, the verb that only checks, and the installed paths mapped into a temp folder.
        var checkArgs = args.Select(a => a == "run" ? "check" : a.Replace("/etc/loopwatch/loopwatch.json", config).Replace("/var/lib/loopwatch", Path.Combine(dir, "data"))).ToArray();
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        var code = await Cli.RunAsync(checkArgs, stdout, stderr);
        Assert.True(code == 0, stderr.ToString());
        Assert.Contains("configuration ok: 1 loops", stdout.ToString());
    }
}

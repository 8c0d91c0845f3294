using System.Text.Json;

namespace LoopWatch.Agent.Tests.Analyze;

/// <summary>Runs <c>loopwatch analyze</c> through the real CLI entry in a temp folder and keeps what it printed.</summary>
public sealed class AnalyzeRun : IDisposable
{
    public string Dir { get; } = Directory.CreateTempSubdirectory("lw-analyze-").FullName;

    public string File(string name, string text)
    {
        var path = Path.Combine(Dir, name);
        System.IO.File.WriteAllText(path, text);
        return path;
    }

    public string PathOf(string name) => Path.Combine(Dir, name);

    public async Task<(int Exit, string Out, string Err)> Cli(params string[] args)
    {
        var o = new StringWriter();
        var e = new StringWriter();
        var exit = await LoopWatch.Agent.Cli.RunAsync(["analyze", .. args], o, e);
        return (exit, o.ToString(), e.ToString());
    }

    /// <summary>Analyses files to JSON; fails the test on a non-zero exit unless <paramref name="expectExit"/> says otherwise.</summary>
    public async Task<JsonElement> Json(string config, params string[] files)
    {
        var (exit, stdout, stderr) = await Cli(["--config", config, "--format", "json", .. files]);
        Assert.True(exit == 0, $"exit {exit}: {stderr}");
        return JsonDocument.Parse(stdout).RootElement;
    }

    public static JsonElement Loop(JsonElement report, string id) =>
        report.GetProperty("loops").EnumerateArray().Single(l => l.GetProperty("id").GetString() == id);

    public void Dispose()
    {
        try { Directory.Delete(Dir, true); } catch (IOException) { }
    }
}

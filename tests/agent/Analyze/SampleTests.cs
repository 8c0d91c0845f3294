using LoopWatch.Agent.Plant;

namespace LoopWatch.Agent.Tests.Analyze;

public sealed class SampleTests
{
    private static readonly string[] SampleLoops = ["PIC-201", "LIC-301", "TIC-202", "FIC-104"];

    private static string Root() => Infrastructure.RepositoryRoot.Path;

    /// <summary>Two hours of four demo loops every 2 s, wide format: what samples/ ships.</summary>
    private static PlantRecording Sample() =>
        PlantRecording.Of(new DemoPlant().Loops.Where(l => SampleLoops.Contains(l.Options.Id)).ToList(), seconds: 7200, every: 2);

    [Fact]
    public void The_shipped_sample_is_what_the_simulator_writes_and_stays_under_1_MB()
    {
        var rec = Sample();
        var csv = rec.WideCsv();
        var config = rec.ConfigJson(_ => new { SampleSeconds = 2 });
        var dir = Path.Combine(Root(), "samples");
        if (Environment.GetEnvironmentVariable("LOOPWATCH_WRITE_SAMPLE") == "1")
        {
            Directory.CreateDirectory(dir);
            File.WriteAllText(Path.Combine(dir, "quillmoor-sample.csv"), csv);
            File.WriteAllText(Path.Combine(dir, "quillmoor-loops.json"), config + "\n");
        }
        Assert.Equal(csv, File.ReadAllText(Path.Combine(dir, "quillmoor-sample.csv")));
        Assert.Equal(config + "\n", File.ReadAllText(Path.Combine(dir, "quillmoor-loops.json")));
        Assert.True(new FileInfo(Path.Combine(dir, "quillmoor-sample.csv")).Length < 1_000_000);
    }

    [Fact]
    public async Task The_sample_analysed_through_the_cli_shows_the_placed_faults()
    {
        var dir = Path.Combine(Root(), "samples");
        using var run = new AnalyzeRun();
        var report = await run.Json(Path.Combine(dir, "quillmoor-loops.json"), Path.Combine(dir, "quillmoor-sample.csv"));
        Assert.Equal(0, report.GetProperty("rejected").GetProperty("rows").GetInt64());
        var kinds = (string id) => AnalyzeRun.Loop(report, id).GetProperty("findings").EnumerateArray().Select(f => f.GetProperty("kind").GetString()).ToList();
        // The demo plant's placed faults (README, "The demo plant"): proportional-only offset, tuning near the ultimate gain.
        Assert.Contains("sustained-offset", kinds("PIC-201"));
        Assert.Contains("oscillation", kinds("TIC-202"));
        Assert.Contains("short-cycling", kinds("LIC-301")); // dead zone too narrow: about 30 starts an hour against 10
        // Advice at the end of the data. LIC-301: rates Qin/A = (Qp - Qin)/A = 0.4 m/min, so 10 starts/h needs
        // D = 6 min / (1/0.4 + 1/0.4) = 1.2 m (wet-well rule, V/Qin + V/(Qp - Qin); pump-station handbooks, from memory).
        var dz = AnalyzeRun.Loop(report, "LIC-301").GetProperty("advice").GetProperty("dead_zone");
        Assert.True(dz.GetProperty("shown").GetBoolean());
        Assert.InRange(dz.GetProperty("narrowest_dead_zone").GetDouble(), 1.14, 1.26);
        Assert.Contains("qualified people", dz.GetProperty("caution").GetString());
        // PIC-201: Seborg, Edgar and Mellichamp's P-only offset Kp M / (1 + Kc Kp) = 9 / 3 = 3 % at PB 50 %; 9 / 5 = 1.8 % at PB 25 %.
        var whatIf = AnalyzeRun.Loop(report, "PIC-201").GetProperty("advice").GetProperty("offset_what_if");
        var quarter = whatIf.GetProperty("rows").EnumerateArray().Single(r => r.GetProperty("pb_pct").GetDouble() == 25);
        Assert.InRange(quarter.GetProperty("offset_pct").GetDouble(), 1.7, 1.9);
        // FIC-104 is put in manual for 40 of the first 120 minutes (from 30 to 70 min).
        var auto = AnalyzeRun.Loop(report, "FIC-104").GetProperty("stats").GetProperty("time_in_auto_pct").GetDouble();
        Assert.InRange(auto, 100 - 40.0 / 120 * 100 - 0.1, 100 - 40.0 / 120 * 100 + 0.1);
    }
}

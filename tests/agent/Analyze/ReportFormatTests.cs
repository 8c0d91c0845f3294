using System.Globalization;
using LoopWatch.Agent.Analyze;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Advice;
using nietras.SeparatedValues;

namespace LoopWatch.Agent.Tests.Analyze;

/// <summary>
/// The shipped sample through <c>analyze</c> in the text and CSV formats: the same figures as the JSON report, and the
/// advice with its working and caution, whose numbers redo by hand.
/// </summary>
public sealed class ReportFormatTests : IDisposable
{
    private readonly AnalyzeRun _run = new();
    private static readonly string Samples = Path.Combine(Infrastructure.RepositoryRoot.Path, "samples");
    private static readonly string Config = Path.Combine(Samples, "quillmoor-loops.json");
    private static readonly string Sample = Path.Combine(Samples, "quillmoor-sample.csv");

    public void Dispose() => _run.Dispose();

    private async Task<string> ReportAsync(string format)
    {
        var (exit, stdout, stderr) = await _run.Cli("--config", Config, "--format", format, Sample);
        Assert.True(exit == 0, $"exit {exit}: {stderr}");
        return stdout;
    }

    [Fact]
    public async Task The_text_report_gives_each_advisers_working_with_the_caution_and_the_figures_of_the_json_report()
    {
        var text = await ReportAsync("text");
        var json = await _run.Json(Config, Sample);
        var dz = AnalyzeRun.Loop(json, "LIC-301").GetProperty("advice").GetProperty("dead_zone");
        var sump = text[text.IndexOf("LIC-301 (on-off", StringComparison.Ordinal)..text.IndexOf("PIC-201 (pid", StringComparison.Ordinal)];

        Assert.Contains("advice, Dead-zone sizing: ", sump);
        Assert.Contains(AdviceCaution.Text, sump);
        Assert.Contains($"D = {Rounding.Text(dz.GetProperty("dead_zone").GetDouble())} m", sump);
        Assert.Equal(dz.GetProperty("dead_zone").GetDouble(), WorkedAdvice.CycleRedoes(sump));
        // The sample's sump fills and empties at 0.4 m/min, so 10 starts/h needs D = 6 / (1/0.4 + 1/0.4) = 1.2 m.
        Assert.Contains("at least 1.2 m keeps within 10 starts/h", sump);

        // A loop without a configured dead time says why it has no performance index.
        var fic = text[text.IndexOf("FIC-104 (pid", StringComparison.Ordinal)..];
        Assert.Contains("advice, Performance index (Harris): not shown: Tuning:DeadTimeSeconds is not configured", fic);
        Assert.EndsWith(ReportOrder.Caution, text.TrimEnd());
    }

    [Fact]
    public async Task The_csv_report_has_a_row_per_loop_with_the_json_figures_and_the_advice_headlines()
    {
        var csv = await ReportAsync("csv");
        var json = await _run.Json(Config, Sample);
        using var reader = Sep.Reader(o => o with { Unescape = true, CultureInfo = CultureInfo.InvariantCulture }).FromText(csv);
        var rows = new Dictionary<string, Dictionary<string, string>>();
        foreach (var row in reader)
        {
            var cells = new Dictionary<string, string>();
            foreach (var name in reader.Header.ColNames) cells[name] = row[name].ToString();
            rows[cells["id"]] = cells;
        }

        Assert.Equal(["FIC-104", "LIC-301", "PIC-201", "TIC-202"], rows.Keys.Order());
        foreach (var (id, row) in rows)
        {
            var stats = AnalyzeRun.Loop(json, id).GetProperty("stats");
            foreach (var key in new[] { "mean_error_pct", "reversals_per_hour", "starts_per_hour", "duty_pct" })
            {
                var value = stats.GetProperty(key);
                if (value.ValueKind == System.Text.Json.JsonValueKind.Null) Assert.Equal("", row[key]);
                else Assert.Equal(value.GetDouble(), double.Parse(row[key], CultureInfo.InvariantCulture), 1e-4);
            }
        }
        Assert.Contains("at least 1.2 m keeps within 10 starts/h", rows["LIC-301"]["advice"]);
        // PIC-201 is proportional-only at PB 50 %: offset K_L M / (1 + Kc Kp) gives 9 / 5 = 1.8 % at PB 25 %
        // (Seborg, Edgar and Mellichamp, proportional-control offset); the headline rounds to 4 digits.
        Assert.Matches(@"PB 25 % would leave 1\.[78][0-9]* %", rows["PIC-201"]["advice"]);
        Assert.Equal("", rows["FIC-104"]["advice"]); // its only adviser is not shown (no dead time configured)
    }
}

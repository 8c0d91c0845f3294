using System.Globalization;
using System.Text.RegularExpressions;
using LoopWatch.Agent;
using LoopWatch.Agent.Analyze;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Advice;
using LoopWatch.Dashboard.Tests.Infrastructure;

namespace LoopWatch.Dashboard.Tests.Reports;

/// <summary>The HTML report of <c>analyze</c> for the shipped sample, opened from its file in Chromium as a reader would.</summary>
public sealed partial class AnalyzeHtmlReportTests
{
    [Fact]
    public async Task The_html_report_shows_each_loops_trend_findings_and_worked_advice_with_the_caution()
    {
        var samples = Path.Combine(RepositoryRoot.Path, "samples");
        var file = Path.Combine(Directory.CreateTempSubdirectory("lw-analyze-html-").FullName, "report.html");
        var err = new StringWriter();
        var exit = await Cli.RunAsync(["analyze", "--config", Path.Combine(samples, "quillmoor-loops.json"), "--format", "html", "--out", file,
            Path.Combine(samples, "quillmoor-sample.csv")], new StringWriter(), err);
        Assert.True(exit == 0, err.ToString());
        Assert.DoesNotContain("<script", await File.ReadAllTextAsync(file)); // a static file: nothing runs when it is opened

        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();
        await page.GotoAsync(new Uri(file).AbsoluteUri);
        Assert.Equal("LoopWatch loop analysis", await page.TitleAsync());
        Assert.Contains(ReportOrder.Caution, await page.Locator("p.caution").InnerTextAsync());
        Assert.Equal(4, await page.Locator("section.loop svg").CountAsync());

        var sump = await page.Locator("#loop-LIC-301 .advice[data-adviser=dead-zone]").InnerTextAsync();
        Assert.Contains(AdviceCaution.Text, sump);
        // T = D / rise + D / fall and 60 / T starts an hour for an integrating level (wet-well rule, V/Qin + V/(Qp - Qin);
        // pump-station handbooks, from memory), redone from the figures the page prints.
        var d = Num(DeadZoneLine().Match(sump), 1);
        var cycle = CycleLine().Match(sump);
        Assert.True(cycle.Success, sump);
        var t = Num(cycle, 3);
        Assert.Equal(d / Num(cycle, 1) + d / Num(cycle, 2), t, 2e-3 * t);
        Assert.Equal(60 / t, Num(cycle, 4), 2e-3 * Num(cycle, 4));

        // PIC-201, proportional-only at PB 50 %: the what-if table, PB 25 % leaving K_L M / (1 + Kc Kp) = 9 / 5 = 1.8 %
        // (Seborg, Edgar and Mellichamp, proportional-control offset; the sample's Kp is 1 and load effect 9 % of span).
        var rows = page.Locator("#loop-PIC-201 .advice[data-adviser=offset-what-if] tbody tr");
        Assert.Equal(5, await rows.CountAsync());
        var quarter = (await rows.AllInnerTextsAsync()).Single(r => r.StartsWith("25\t", StringComparison.Ordinal));
        Assert.InRange(double.Parse(quarter.Split('\t')[2], CultureInfo.InvariantCulture), 1.7, 1.9);
        Assert.Contains("Tuning:DeadTimeSeconds is not configured", await page.Locator("#loop-FIC-104 .advice[data-adviser=performance]").InnerTextAsync());
        await Chromium.ShotAsync(page, "analyze-report");
    }

    private static double Num(Match m, int group) => double.Parse(m.Groups[group].Value, CultureInfo.InvariantCulture);

    [GeneratedRegex(@"dead zone now is D = ([0-9.]+)")]
    private static partial Regex DeadZoneLine();

    [GeneratedRegex(@"T = D / ([0-9.]+) \+ D / ([0-9.]+) = ([0-9.]+) min, so 60 / T = ([0-9.]+) starts/h")]
    private static partial Regex CycleLine();
}

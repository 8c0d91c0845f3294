using System.Globalization;
using LoopWatch.Agent;
using LoopWatch.Agent.Analyze;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Advice;
using LoopWatch.Dashboard.Tests.Infrastructure;

namespace LoopWatch.Dashboard.Tests.Reports;

/// <summary>The HTML report of <c>analyze</c> for the shipped sample, opened from its file in Chromium as a reader would.</summary>
public sealed class AnalyzeHtmlReportTests
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
        WorkedAdvice.CycleRedoes(sump);

        // PIC-201, proportional-only at PB 50 %: the what-if table, PB 25 % leaving K_L M / (1 + Kc Kp) = 9 / 5 = 1.8 %
        // (Seborg, Edgar and Mellichamp, proportional-control offset; the sample's Kp is 1 and load effect 9 % of span).
        var rows = page.Locator("#loop-PIC-201 .advice[data-adviser=offset-what-if] tbody tr");
        Assert.Equal(5, await rows.CountAsync());
        var quarter = (await rows.AllInnerTextsAsync()).Single(r => r.StartsWith("25\t", StringComparison.Ordinal));
        Assert.InRange(double.Parse(quarter.Split('\t')[2], CultureInfo.InvariantCulture), 1.7, 1.9);
        Assert.Contains("Tuning:DeadTimeSeconds is not configured", await page.Locator("#loop-FIC-104 .advice[data-adviser=performance]").InnerTextAsync());
        await Chromium.ShotAsync(page, "analyze-report");
    }
}

using LoopWatch.Analytics.Advice;
using LoopWatch.Analytics.DeadZone;
using LoopWatch.Analytics.Performance;
using LoopWatch.Dashboard.Reports;

namespace LoopWatch.Dashboard.Tests.Reports;

public sealed class OffenderAdviceTests
{
    private static LoopWeek Week(string id, double anyFinding, double osc = 0) => new(id, "Effluent", 10, 5, osc, 0, 0, anyFinding, 0, 0);

    [Fact]
    public void Offenders_with_shown_advice_are_listed_most_time_with_findings_first()
    {
        var loops = new[] { Week("LIC-301", 7200), Week("TIC-202", 3600, osc: 3600), Week("FIC-101", 0), Week("PIC-201", 600) };
        var summary = new WeeklySummary(ReportWeek.Containing(new DateOnly(2026, 3, 2), TimeZoneInfo.Utc), 4, 40, 20, [], loops,
            [loops[1]], [], [], new AlarmRate(0, 0, 0, "acceptable"));
        var shown = new DeadZoneAdvice(null, null, "m", 10, DeadZone: 0.4, NarrowestDeadZone: 1.2, StartsPerHour: 30);
        var hidden = new PerformanceAdvice(null, "Tuning:DeadTimeSeconds is not configured");
        var advice = new Dictionary<string, LoopAdvice>
        {
            ["LIC-301"] = new(shown, null, null),
            ["TIC-202"] = new(null, null, hidden),
            ["FIC-101"] = new(shown, null, null),
        };
        var list = OffenderAdvice.For(summary, id => advice.TryGetValue(id, out var a) ? a : null);
        // FIC-101 had no finding all week; TIC-202's only advice is not shown; PIC-201 has none.
        var only = Assert.Single(list);
        Assert.Equal("LIC-301", only.LoopId);
        Assert.Same(shown, Assert.Single(only.Advice));
        Assert.Contains("1.2", shown.Headline);
    }
}

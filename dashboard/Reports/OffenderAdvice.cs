using LoopWatch.Analytics.Advice;

namespace LoopWatch.Dashboard.Reports;

/// <summary>A top offender of the week with the advice its loop has now (shown advice only).</summary>
public sealed record OffenderAdvice(string LoopId, string Area, double SecondsAnyFinding, IReadOnlyList<AdviserResult> Advice)
{
    /// <summary>
    /// The loops of the week's top lists and the ten with most time with any finding, most such time first, each with
    /// the advice <paramref name="adviceNow"/> gives for it; loops without shown advice are left out.
    /// </summary>
    public static IReadOnlyList<OffenderAdvice> For(WeeklySummary week, Func<string, LoopAdvice?> adviceNow)
    {
        var byFindings = week.Loops.Where(l => l.SecondsAnyFinding > 0)
            .OrderByDescending(l => l.SecondsAnyFinding).ThenBy(l => l.LoopId, StringComparer.Ordinal).Take(WeeklySummary.TopCount);
        return week.TopOscillating.Concat(week.TopOffset).Concat(week.TopReversals).Concat(byFindings)
            .DistinctBy(l => l.LoopId)
            .OrderByDescending(l => l.SecondsAnyFinding).ThenBy(l => l.LoopId, StringComparer.Ordinal)
            .Select(l => new OffenderAdvice(l.LoopId, l.Area, l.SecondsAnyFinding, adviceNow(l.LoopId)?.All().Where(a => a.Shown).ToList() ?? []))
            .Where(o => o.Advice.Count > 0)
            .ToList();
    }
}

using System.Globalization;
using LoopWatch.Dashboard.Reports;

namespace LoopWatch.Agent.Report;

/// <summary>The weekly summary as plain text for a terminal or an e-mail: totals, areas, the top lists and the alarm rate.</summary>
public static class WeeklyText
{
    /// <summary>Writes <paramref name="s"/> merged from <paramref name="databases"/> files.</summary>
    public static void Write(WeeklySummary s, int databases, TextWriter o)
    {
        var c = CultureInfo.InvariantCulture;
        o.WriteLine($"LoopWatch weekly report, week of {s.Week.Key} ({s.Week.Zone.Id}), {databases} database(s)");
        o.WriteLine(string.Create(c, $"  loops monitored {s.LoopsMonitored}, loop-hours with samples {s.Hours}, healthy {Pct(s.HealthyPct)}"));
        var a = s.Alarms;
        o.WriteLine(string.Create(c, $"  alarms: {a.Activations} activations, {a.PerTenMinutes:0.00} per 10 min, busiest 10 min {a.PeakTenMinutes}, {a.Rating}"));
        o.WriteLine();
        o.WriteLine($"  {"area",-24} {"loops",6} {"loop-hours",11} {"healthy",8}");
        foreach (var area in s.Areas) o.WriteLine($"  {area.Area,-24} {area.Loops,6} {area.Hours,11} {Pct(area.HealthyPct),8}");
        Top(o, "oscillating (hours)", s.TopOscillating, l => (l.SecondsOscillating / 3600).ToString("0.00", c));
        Top(o, "with an offset (hours)", s.TopOffset, l => (l.SecondsOffset / 3600).ToString("0.00", c));
        Top(o, "valve reversals", s.TopReversals, l => l.Reversals.ToString(c));
    }

    private static void Top(TextWriter o, string title, IReadOnlyList<LoopWeek> loops, Func<LoopWeek, string> figure)
    {
        o.WriteLine();
        o.WriteLine($"  most {title}:" + (loops.Count == 0 ? " none" : ""));
        foreach (var l in loops) o.WriteLine($"    {l.LoopId,-16} {l.Area,-24} {figure(l),10}");
    }

    private static string Pct(double? p) => p is { } v ? v.ToString("0.0", CultureInfo.InvariantCulture) + " %" : "-";
}

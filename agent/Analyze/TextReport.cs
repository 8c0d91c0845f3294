using System.Globalization;

namespace LoopWatch.Agent.Analyze;

/// <summary>A readable summary: loops with findings first, each with its figures and diagnosis, then what was skipped.</summary>
public static class TextReport
{
    /// <summary>Writes the report to <paramref name="o"/>.</summary>
    public static void Write(AnalysisResult result, TextWriter o)
    {
        var ci = CultureInfo.InvariantCulture;
        var loops = ReportOrder.Sorted(result.Loops).ToList();
        var from = loops.Where(l => l.From is not null).Select(l => l.From!.Value).DefaultIfEmpty().Min();
        var to = loops.Where(l => l.To is not null).Select(l => l.To!.Value).DefaultIfEmpty().Max();
        o.WriteLine(string.Create(ci, $"LoopWatch analysis: {loops.Count} loops, {result.Values:N0} values from {result.Rows:N0} rows in {result.Files.Count} file(s)"));
        if (from != default) o.WriteLine(string.Create(ci, $"span: {ReportOrder.Time(from)} to {ReportOrder.Time(to)}"));
        o.WriteLine(string.Create(ci, $"loops with findings: {loops.Count(l => l.Findings.Count > 0)}; {result.AlarmNote}"));
        o.WriteLine();
        foreach (var l in loops)
        {
            var s = l.Stats;
            var state = l.Findings.Any(f => f.Active) ? "FINDINGS" : l.Findings.Count > 0 ? "ended findings" : "ok";
            o.WriteLine(string.Create(ci, $"{l.Spec.Id} ({l.Kind}, {l.Spec.Process.ToString().ToLowerInvariant()}) {l.Spec.Description}: {state}"));
            o.WriteLine(string.Create(ci, $"  {l.Samples:N0} samples over {s.Hours:0.##} h"));
            if (l.Kind == "pid")
                o.WriteLine(string.Create(ci, $"  error mean {F(s.MeanErrorPct)} %, std {F(s.ErrorStdPct)} % of span; reversals {s.Reversals}/span ({F(s.ReversalsPerHour)}/h), travel {F(s.TravelPctPerHour)} %/h; saturated {F(s.SaturatedPct)} %; in auto {F(s.TimeInAutoPct)} %"));
            else
                o.WriteLine(string.Create(ci, $"  starts {s.Starts} ({F(s.StartsPerHour)}/h), cycle period {F(s.CyclePeriodS)} s, duty {F(s.DutyPct)} %, PV swing +/-{F(s.CycleAmplitudePct)} % of span"));
            foreach (var a in result.AlarmsOf(l.Spec.Id))
                o.WriteLine(string.Create(ci, $"  alarm {l.Spec.Id}:{a.Kind} ({a.Priority.ToString().ToLowerInvariant()}): annunciated {a.Activations} time(s), {a.StateAtEnd} at the end"));
            foreach (var f in l.Findings) o.WriteLine(string.Create(ci, $"  - {f.Kind} {ReportOrder.Time(f.Start)} to {(f.End is null ? "end (still active)" : ReportOrder.Time(f.End))}: {f.Diagnosis}"));
            Advice(l, o);
            o.WriteLine();
        }
        var r = result.Rejects;
        o.WriteLine(string.Create(ci, $"rejected rows: {r.Rows}; unknown tags: {r.UnknownTagCount} ({r.UnknownValues} values); out of order in a file: {r.OutOfOrder}; late values dropped: {result.Late}; outside --from/--to: {result.OutsideRange}"));
        foreach (var e in r.Examples) o.WriteLine(string.Create(ci, $"  {e.File}:{e.Line}: {e.Reason}"));
        if (r.UnknownTags.Count > 0) o.WriteLine(string.Create(ci, $"  unknown: {string.Join(", ", r.UnknownTags.Keys.Take(20))}{(r.UnknownTags.Count > 20 ? ", ..." : "")}"));
        foreach (var e in r.FileErrors) o.WriteLine(string.Create(ci, $"  file: {e}"));
        o.WriteLine();
        o.WriteLine(ReportOrder.Caution);
    }

    // The advisers at the end of the data, each with its working so the figures can be redone by hand.
    private static void Advice(LoopResult l, TextWriter o)
    {
        if (l.WindowStats.Advice is not { } advice) return;
        foreach (var a in advice.All())
        {
            if (!a.Shown)
            {
                o.WriteLine($"  advice, {a.Title}: not shown: {a.NotShownBecause}");
                continue;
            }
            o.WriteLine($"  advice, {a.Title}: {a.Headline}");
            for (var i = 0; i < a.Explanation.Count; i++) o.WriteLine($"      {i + 1}. {a.Explanation[i]}");
            o.WriteLine($"      {a.Caution}");
        }
    }

    private static string F(double? v) => v is { } x ? x.ToString("0.##", CultureInfo.InvariantCulture) : "-";
}

using System.Globalization;
using System.Net;
using System.Text;
using LoopWatch.Dashboard.Charts;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// One self-contained HTML file: a summary table, then per loop the trend of PV/SP/OP with findings marked
/// (<see cref="SvgTrend"/>), the statistics and the diagnosis. Laid out to print on A4.
/// </summary>
public static class HtmlReport
{
    private const string Style = """
        body{font:14px/1.4 system-ui,sans-serif;color:#1f1f1f;margin:24px auto;max-width:1000px;padding:0 12px}
        h1{font-size:22px;margin:0 0 4px}h2{font-size:17px;margin:0 0 4px}
        table{border-collapse:collapse;width:100%;margin:8px 0}th,td{border-bottom:1px solid #d8d8d4;padding:3px 6px;text-align:left;vertical-align:top}
        th{background:#f0f0ec}td.n,th.n{text-align:right;font-variant-numeric:tabular-nums}
        .caution{border:1px solid #8a6d00;background:#fff8e0;padding:8px 12px;margin:12px 0}
        .loop{border-top:2px solid #1f1f1f;padding-top:10px;margin-top:22px;break-inside:avoid;page-break-inside:avoid}
        .state-active{font-weight:700}.meta{color:#555}
        svg.trend{width:100%;height:auto;font-size:11px;fill:#1f1f1f}
        ul.findings{margin:6px 0;padding-left:20px}h3{font-size:15px;margin:10px 0 4px}.advice{margin:6px 0 10px}.advice ol{margin:4px 0;padding-left:22px}
        @page{size:A4;margin:14mm}
        @media print{body{margin:0;max-width:none;font-size:11px}.loop{break-inside:avoid}a{color:inherit;text-decoration:none}}
        """;

    /// <summary>Writes the report to <paramref name="o"/>.</summary>
    public static void Write(AnalysisResult result, TextWriter o)
    {
        var ci = CultureInfo.InvariantCulture;
        var loops = ReportOrder.Sorted(result.Loops).ToList();
        var sb = new StringBuilder(64 * 1024);
        sb.Append("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>LoopWatch loop analysis</title><style>").Append(Style).Append("</style></head><body>");
        var from = loops.Where(l => l.From is not null).Select(l => l.From!.Value).DefaultIfEmpty().Min();
        var to = loops.Where(l => l.To is not null).Select(l => l.To!.Value).DefaultIfEmpty().Max();
        sb.Append("<h1>LoopWatch loop analysis</h1>");
        sb.Append(ci, $"<p class=\"meta\">{loops.Count} loops, {result.Values:N0} values from {result.Rows:N0} rows in {E(string.Join(", ", result.Files.Select(Path.GetFileName)))}; ");
        sb.Append(ci, $"{E(ReportOrder.Time(from))} to {E(ReportOrder.Time(to))}. {E(result.AlarmNote)}.</p>");
        sb.Append("<p class=\"caution\"><strong>Caution.</strong> ").Append(E(ReportOrder.Caution)).Append("</p>");

        sb.Append("<table><thead><tr><th>loop</th><th>kind</th><th>description</th><th>findings</th><th>alarms</th><th>samples</th><th>key figure</th></tr></thead><tbody>");
        foreach (var l in loops)
        {
            var kinds = string.Join(", ", l.Findings.Select(f => f.Active ? f.Kind : $"{f.Kind} (ended)").Distinct());
            sb.Append(ci, $"<tr><td><a href=\"#{E(Anchor(l))}\">{E(l.Spec.Id)}</a></td><td>{E(l.Kind)}</td><td>{E(l.Spec.Description)}</td>");
            sb.Append(ci, $"<td class=\"{(l.Findings.Any(f => f.Active) ? "state-active" : "")}\">{(kinds.Length == 0 ? "none" : E(kinds))}</td><td>{E(Alarms(result, l))}</td><td class=\"n\">{l.Samples:N0}</td><td>{E(KeyFigure(l))}</td></tr>");
        }
        sb.Append("</tbody></table>");

        foreach (var l in loops) Loop(sb, l, Alarms(result, l));
        Rejected(sb, result);
        sb.Append("</body></html>");
        o.Write(sb.ToString());
    }

    private static string Alarms(AnalysisResult result, LoopResult l)
    {
        var list = result.AlarmsOf(l.Spec.Id);
        return list.Count == 0 ? "none" : string.Join(", ", list.Select(a => $"{a.Kind} x{a.Activations} ({a.StateAtEnd} at end)"));
    }

    private static void Loop(StringBuilder sb, LoopResult l, string alarms)
    {
        var ci = CultureInfo.InvariantCulture;
        var s = l.Stats;
        sb.Append(ci, $"<section class=\"loop\" id=\"{E(Anchor(l))}\"><h2>{E(l.Spec.Id)} &mdash; {E(l.Spec.Description)}</h2>");
        sb.Append(ci, $"<p class=\"meta\">{E(l.Kind)}, {E(l.Spec.Process.ToString().ToLowerInvariant())}, {E(l.Spec.Area)}; PV {l.Spec.PvMin.ToString("G4", ci)} to {l.Spec.PvMax.ToString("G4", ci)} {E(l.Spec.Unit)}; {l.Samples:N0} samples over {s.Hours:0.##} h</p>");
        if (l.From is { } from && l.To is { } to && l.Trend.Count > 0)
        {
            var markers = new List<TrendMarker>();
            foreach (var f in l.Findings)
            {
                markers.Add(new TrendMarker(f.Start, $"{f.Kind} raised {ReportOrder.Time(f.Start)}"));
                if (f.End is { } end) markers.Add(new TrendMarker(end, $"{f.Kind} ended {ReportOrder.Time(end)}"));
            }
            var pad = TimeSpan.FromTicks(Math.Max(TimeSpan.TicksPerSecond, (to - from).Ticks / 200));
            sb.Append(SvgTrend.Render(l.Trend, l.Spec.PvMin, l.Spec.PvMax, l.Spec.Unit, from, to + pad, markers, $"{l.Spec.Id} PV, SP and OP"));
        }
        sb.Append("<table><tbody>");
        if (l.Kind == "pid")
        {
            Row(sb, "mean error (SP - PV), % of span", s.MeanErrorPct);
            Row(sb, "error standard deviation, % of span", s.ErrorStdPct);
            Row(sb, "output reversals", s.Reversals);
            Row(sb, "output reversals per hour", s.ReversalsPerHour);
            Row(sb, "output travel, % per hour", s.TravelPctPerHour);
            Row(sb, "output saturated, % of time", s.SaturatedPct);
            Row(sb, "in auto, % of time", s.TimeInAutoPct);
        }
        else
        {
            Row(sb, "starts", s.Starts);
            Row(sb, "starts per hour", s.StartsPerHour);
            Row(sb, "cycle period, s", s.CyclePeriodS);
            Row(sb, "duty (on), % of time", s.DutyPct);
            Row(sb, "PV swing (half peak-to-peak), % of span", s.CycleAmplitudePct);
        }
        sb.Append("</tbody></table>");
        sb.Append("<p><strong>Alarms the agent would have raised:</strong> ").Append(E(alarms)).Append("</p>");
        if (l.Findings.Count == 0) sb.Append("<p>No findings over the span analysed.</p>");
        else
        {
            sb.Append("<ul class=\"findings\">");
            foreach (var f in l.Findings)
                sb.Append(ci, $"<li><strong>{E(f.Kind)}</strong> {E(ReportOrder.Time(f.Start))} to {E(f.End is null ? "end of data (still active)" : ReportOrder.Time(f.End))}: {E(f.Diagnosis)}</li>");
            sb.Append("</ul>");
        }
        Advice(sb, l);
        sb.Append("</section>");
    }

    // As on the dashboard's loop page: each adviser's working as a numbered list, the what-if table, and the caution.
    private static void Advice(StringBuilder sb, LoopResult l)
    {
        if (l.WindowStats.Advice is not { } advice || !advice.All().Any()) return;
        var ci = CultureInfo.InvariantCulture;
        sb.Append("<h3>Advice at the end of the data</h3>");
        foreach (var a in advice.All())
        {
            sb.Append(ci, $"<div class=\"advice\" data-adviser=\"{E(a.Adviser)}\"><p><strong>{E(a.Title)}.</strong> ");
            if (!a.Shown)
            {
                sb.Append(ci, $"Not shown: {E(a.NotShownBecause ?? "")}</p></div>");
                continue;
            }
            sb.Append(E(a.Headline)).Append("</p><ol>");
            foreach (var line in a.Explanation) sb.Append("<li>").Append(E(line)).Append("</li>");
            sb.Append("</ol>");
            if (a is LoopWatch.Analytics.ProportionalBand.ProportionalBandAdvice { Rows: { } rows })
            {
                sb.Append("<table><thead><tr><th class=\"n\">PB %</th><th class=\"n\">Kc</th><th class=\"n\">offset, % of span</th><th class=\"n\">gain margin</th><th></th></tr></thead><tbody>");
                foreach (var r in rows)
                    sb.Append(ci, $"<tr><td class=\"n\">{T(r.PbPct)}</td><td class=\"n\">{T(r.Kc)}</td><td class=\"n\">{T(r.OffsetPct)}</td><td class=\"n\">{(r.GainMargin is { } m ? T(m) : "-")}</td><td>{(r.Current ? "now" : r.Oscillates ? "would oscillate" : "")}</td></tr>");
                sb.Append("</tbody></table>");
            }
            sb.Append("<p class=\"meta\">").Append(E(a.Caution)).Append("</p></div>");
        }
    }

    private static string T(double v) => LoopWatch.Analytics.Advice.Rounding.Text(v);

    private static void Rejected(StringBuilder sb, AnalysisResult result)
    {
        var ci = CultureInfo.InvariantCulture;
        var r = result.Rejects;
        sb.Append("<section class=\"loop\"><h2>Input</h2><table><tbody>");
        Row(sb, "rows rejected", r.Rows);
        Row(sb, "values of unknown tags", r.UnknownValues);
        Row(sb, "rows out of time order within a file", r.OutOfOrder);
        Row(sb, "late values dropped", result.Late);
        sb.Append("</tbody></table>");
        if (r.Examples.Count > 0)
        {
            sb.Append("<ul>");
            foreach (var e in r.Examples) sb.Append(ci, $"<li>{E(Path.GetFileName(e.File))}:{e.Line}: {E(e.Reason)}</li>");
            sb.Append("</ul>");
        }
        if (r.UnknownTags.Count > 0) sb.Append(ci, $"<p>Unknown tags: {E(string.Join(", ", r.UnknownTags.Keys.Take(30)))}</p>");
        foreach (var e in r.FileErrors) sb.Append(ci, $"<p>{E(e)}</p>");
        sb.Append("</section>");
    }

    private static string KeyFigure(LoopResult l)
    {
        var s = l.Stats;
        var ci = CultureInfo.InvariantCulture;
        return l.Kind == "pid"
            ? $"error {F(s.MeanErrorPct)} % ± {F(s.ErrorStdPct)} %, {F(s.ReversalsPerHour)} reversals/h, auto {F(s.TimeInAutoPct)} %"
            : string.Create(ci, $"{F(s.StartsPerHour)} starts/h, period {F(s.CyclePeriodS)} s, duty {F(s.DutyPct)} %");
    }

    private static void Row(StringBuilder sb, string label, double? v) =>
        sb.Append(CultureInfo.InvariantCulture, $"<tr><th>{E(label)}</th><td class=\"n\">{F(v)}</td></tr>");

    private static void Row(StringBuilder sb, string label, long? v) =>
        sb.Append(CultureInfo.InvariantCulture, $"<tr><th>{E(label)}</th><td class=\"n\">{(v is { } x ? x.ToString("N0", CultureInfo.InvariantCulture) : "-")}</td></tr>");

    private static string F(double? v) => v is { } x ? x.ToString("0.##", CultureInfo.InvariantCulture) : "-";

    private static string Anchor(LoopResult l) => "loop-" + l.Spec.Id;

    private static string E(string s) => WebUtility.HtmlEncode(s);
}

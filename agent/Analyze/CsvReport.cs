using System.Globalization;
using nietras.SeparatedValues;

namespace LoopWatch.Agent.Analyze;

/// <summary>One CSV row per loop with its whole-span statistics, finding kinds and advice headlines; empty cells where a figure does not apply.</summary>
public static class CsvReport
{
    /// <summary>Writes the report to <paramref name="output"/>.</summary>
    public static void Write(AnalysisResult result, TextWriter output)
    {
        using var writer = Sep.New(',').Writer(o => o with { Escape = true, CultureInfo = CultureInfo.InvariantCulture }).To(output, leaveOpen: true);
        foreach (var l in ReportOrder.Sorted(result.Loops))
        {
            var s = l.Stats;
            using var row = writer.NewRow();
            row["id"].Set(l.Spec.Id);
            row["kind"].Set(l.Kind);
            row["process"].Set(l.Spec.Process.ToString().ToLowerInvariant());
            row["samples"].Format(l.Samples);
            row["hours"].Set(N(s.Hours));
            row["findings"].Set(string.Join(' ', l.Findings.Select(f => f.Kind).Distinct()));
            row["active_findings"].Set(string.Join(' ', l.Findings.Where(f => f.Active).Select(f => f.Kind).Distinct()));
            row["mean_error_pct"].Set(N(s.MeanErrorPct));
            row["error_std_pct"].Set(N(s.ErrorStdPct));
            row["reversals"].Set(s.Reversals?.ToString(CultureInfo.InvariantCulture) ?? "");
            row["reversals_per_hour"].Set(N(s.ReversalsPerHour));
            row["travel_pct_per_hour"].Set(N(s.TravelPctPerHour));
            row["saturated_pct"].Set(N(s.SaturatedPct));
            row["time_in_auto_pct"].Set(N(s.TimeInAutoPct));
            row["starts"].Set(s.Starts?.ToString(CultureInfo.InvariantCulture) ?? "");
            row["starts_per_hour"].Set(N(s.StartsPerHour));
            row["cycle_period_s"].Set(N(s.CyclePeriodS));
            row["duty_pct"].Set(N(s.DutyPct));
            row["cycle_amplitude_pct"].Set(N(s.CycleAmplitudePct));
            // One line per adviser that shows figures; the working is in the text, HTML and JSON reports.
            row["advice"].Set(string.Join(" | ", l.WindowStats.Advice?.All().Where(a => a.Shown).Select(a => a.Headline) ?? []));
        }
    }

    private static string N(double? v) => v is { } x ? x.ToString("0.####", CultureInfo.InvariantCulture) : "";
}

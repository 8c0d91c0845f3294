using System.Globalization;
using System.Text;

namespace LoopWatch.Dashboard.Reports;

/// <summary>The weekly summary as CSV (RFC 4180), one row per loop; times in hours, percentages to one decimal.</summary>
public static class WeeklyCsv
{
    /// <summary>The header row's columns.</summary>
    public static readonly string[] Columns =
    [
        "week", "loop_id", "area", "hours_with_samples", "healthy_hours", "healthy_pct", "hours_oscillating",
        "hours_offset", "reversals", "hours_any_finding", "hours_stale", "hours_manual",
    ];

    /// <summary>The CSV text, CRLF line ends as RFC 4180 asks.</summary>
    public static string Write(WeeklySummary summary)
    {
        var sb = new StringBuilder();
        sb.Append(string.Join(',', Columns)).Append("\r\n");
        foreach (var l in summary.Loops)
        {
            string[] fields =
            [
                summary.Week.Key, Field(l.LoopId), Field(l.Area), Num(l.Hours), Num(l.HealthyHours),
                l.HealthyPct is { } p ? p.ToString("0.0", CultureInfo.InvariantCulture) : "",
                Hours(l.SecondsOscillating), Hours(l.SecondsOffset), Num(l.Reversals), Hours(l.SecondsAnyFinding),
                Hours(l.SecondsStale), Hours(l.SecondsManual),
            ];
            sb.Append(string.Join(',', fields)).Append("\r\n");
        }
        return sb.ToString();
    }

    private static string Num(long n) => n.ToString(CultureInfo.InvariantCulture);

    private static string Hours(double seconds) => (seconds / 3600).ToString("0.00", CultureInfo.InvariantCulture);

    // Quote when RFC 4180 needs it; a leading formula character is defused so a spreadsheet shows the text (OWASP CSV injection).
    private static string Field(string text)
    {
        if (text.Length > 0 && "=+-@\t\r".Contains(text[0], StringComparison.Ordinal)) text = "'" + text;
        return text.AsSpan().IndexOfAny(",\"\r\n") >= 0 ? "\"" + text.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : text;
    }
}

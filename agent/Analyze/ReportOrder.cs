namespace LoopWatch.Agent.Analyze;

/// <summary>The order every report lists loops in: active findings first, then ended ones, then clean loops, each by id.</summary>
public static class ReportOrder
{
    /// <summary>The loops sorted for people.</summary>
    public static IEnumerable<LoopResult> Sorted(IEnumerable<LoopResult> loops) =>
        loops.OrderBy(l => l.Findings.Any(f => f.Active) ? 0 : l.Findings.Count > 0 ? 1 : 2).ThenBy(l => l.Spec.Id, StringComparer.Ordinal);

    /// <summary>The caution every report carries.</summary>
    public const string Caution =
        "Advisory only: LoopWatch is not a safety system (IEC 61511 / ISA-84) and must not be relied on for protection. " +
        "Any tuning change or valve work it suggests follows the site's procedures and is done by qualified people.";

    /// <summary>A time as reports print it.</summary>
    public static string Time(DateTimeOffset? t) => t is { } v ? v.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss'Z'", System.Globalization.CultureInfo.InvariantCulture) : "-";
}

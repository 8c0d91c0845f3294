using LoopWatch.Analytics.Findings;

namespace LoopWatch.Dashboard.Model;

/// <summary>
/// The plant's loops by state, as the Plant page counts them: stale (no data yet or a stale finding), in manual, with
/// findings (and not stale), healthy (no finding, not in manual). A loop in manual with findings counts in both.
/// </summary>
public readonly record struct LoopCounts(int Total, int Healthy, int WithFindings, int InManual, int Stale)
{
    /// <summary>Counts <paramref name="loops"/>.</summary>
    public static LoopCounts Of(IReadOnlyList<LoopView> loops) => new(
        loops.Count,
        loops.Count(l => l.Findings.Count == 0 && l.Mode != "manual"),
        loops.Count(l => l.Findings.Count > 0 && !IsStale(l)),
        loops.Count(l => l.Mode == "manual"),
        loops.Count(IsStale));

    /// <summary>True when the loop has had no data yet or its data stopped (stale finding).</summary>
    public static bool IsStale(LoopView l) => l.Findings.Any(f => f.Kind == FindingKinds.Stale) || l.LastUpdate is null;
}

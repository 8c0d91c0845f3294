using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Dashboard.Model;

namespace LoopWatch.Dashboard.Api;

/// <summary>The shape of one loop in <c>GET /api/loops</c>.</summary>
public sealed record LoopJson(
    string Id,
    string Kind,
    string Area,
    string Description,
    string Process,
    double? Pv,
    double? Sp,
    double? Op,
    string Unit,
    string Mode,
    DateTimeOffset? LastUpdate,
    long Samples,
    LoopStatistics Stats,
    IReadOnlyList<object> Findings)
{
    /// <summary>Maps a view; findings are typed as object so each serialises with its own figures.</summary>
    public static LoopJson From(LoopView v) => new(v.Id, v.Kind, v.Area, v.Description, v.Process, v.Pv, v.Sp, v.Op, v.Unit, v.Mode,
        v.LastUpdate, v.Samples, v.Statistics, v.Findings.Select(f => FindingJson(f)).ToArray());

    private static object FindingJson(Finding f) => f;
}

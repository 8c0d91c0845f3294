using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;

namespace LoopWatch.Dashboard.Model;

/// <summary>What the dashboard and the API show of one loop at one moment.</summary>
public sealed record LoopView(
    string Id,
    string Description,
    string Area,
    string Kind,
    string Process,
    string Unit,
    double PvMin,
    double PvMax,
    double? Pv,
    double? Sp,
    double? Op,
    string Mode,
    DateTimeOffset? LastUpdate,
    IReadOnlyList<Finding> Findings,
    LoopStatistics Statistics,
    long Samples);

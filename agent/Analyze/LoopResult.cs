using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Dashboard.Model;

namespace LoopWatch.Agent.Analyze;

/// <summary>What the analysis found on one loop: whole-span figures, the monitor's rolling figures at the end, every finding, the trend.</summary>
public sealed record LoopResult(
    LoopSpec Spec,
    long Samples,
    long LateValues,
    long BadValues,
    DateTimeOffset? From,
    DateTimeOffset? To,
    SpanStatistics Stats,
    LoopStatistics WindowStats,
    IReadOnlyList<Finding> Findings,
    IReadOnlyList<TrendPoint> Trend)
{
    /// <summary>"pid" or "on-off", as in the configuration.</summary>
    public string Kind => Spec.Kind == LoopKind.Pid ? "pid" : "on-off";
}

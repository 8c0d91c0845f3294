using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Alarms;

/// <summary>Evaluates a loop's alarms at every aligned sample, in the sample's event time; sits after the detectors.</summary>
public sealed class AlarmFeed(LoopAlarms alarms, Func<LoopStatistics> statistics) : LoopDetector
{
    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board) =>
        alarms.Evaluate(sample.Ticks, sample.Mode, board, statistics, sample.Pv);
}

using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Ingest;

/// <summary>Feeds each aligned sample into the loop's trend buffer; sits last in the detector list.</summary>
public sealed class TrendRecorder(TrendBuffer buffer) : LoopDetector
{
    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board) => buffer.Add(sample.Ticks, sample.Pv, sample.Sp, sample.Op);
}

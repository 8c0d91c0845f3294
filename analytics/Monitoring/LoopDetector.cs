using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Monitoring;

/// <summary>One detector of one loop: fed every aligned sample in event-time order; raises and ends findings on the board.</summary>
public abstract class LoopDetector
{
    /// <summary>Takes one aligned sample. Must not allocate in steady state.</summary>
    public abstract void Step(in AlignedSample sample, FindingBoard board);

    /// <summary>Adds this detector's figures to the loop's statistics.</summary>
    public virtual LoopStatistics Fill(LoopStatistics stats) => stats;

    /// <summary>Called when data stops (stale) or resumes after a gap: windows that span the gap are restarted.</summary>
    public virtual void Reset() { }
}

using LoopWatch.Analytics.DeadZone;
using LoopWatch.Analytics.Performance;
using LoopWatch.Analytics.ProportionalBand;

namespace LoopWatch.Analytics.Advice;

/// <summary>The advisers' results for one loop; null where an adviser does not apply to the loop.</summary>
public readonly record struct LoopAdvice(DeadZoneAdvice? DeadZone, ProportionalBandAdvice? OffsetWhatIf, PerformanceAdvice? Performance)
{
    /// <summary>The results that apply, in the order pages list them.</summary>
    public IEnumerable<AdviserResult> All()
    {
        if (DeadZone is not null) yield return DeadZone;
        if (OffsetWhatIf is not null) yield return OffsetWhatIf;
        if (Performance is not null) yield return Performance;
    }
}

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Reversals;

namespace LoopWatch.Analytics.Monitoring;

/// <summary>Builds the detectors that apply to a loop's kind.</summary>
public static class DetectorSet
{
    /// <summary>The detectors for one loop, in the order they see each sample.</summary>
    public static IReadOnlyList<LoopDetector> For(LoopSpec spec)
    {
        var list = new List<LoopDetector>();
        // Data quality first, then the loop-kind families (on-off cycles; pid output reversals and saturation).
        list.Add(new OutOfRangeDetector(spec));
        list.Add(new FrozenDetector(spec));
        if (spec.Kind == LoopKind.OnOff) list.Add(new ShortCyclingDetector(spec));
        else { list.Add(new ReversalDetector(spec)); list.Add(new SaturationDetector(spec)); }
        return list;
    }
}

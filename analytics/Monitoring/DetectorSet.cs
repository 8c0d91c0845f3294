using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Analytics.Monitoring;

/// <summary>Builds the detectors that apply to a loop's kind.</summary>
public static class DetectorSet
{
    /// <summary>The detectors for one loop, in the order they see each sample.</summary>
    public static IReadOnlyList<LoopDetector> For(LoopSpec spec)
    {
        var list = new List<LoopDetector>();
        return list;
    }
}

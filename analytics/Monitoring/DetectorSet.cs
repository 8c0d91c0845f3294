using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.DeadZone;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Offset;
using LoopWatch.Analytics.Oscillation;
using LoopWatch.Analytics.Performance;
using LoopWatch.Analytics.ProportionalBand;
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
        // Data quality first, then the loop-kind families.
        list.Add(new OutOfRangeDetector(spec));
        list.Add(new FrozenDetector(spec));
        if (spec.Kind == LoopKind.Pid)
        {
            // Oscillation first: the offset detector reads its finding from the board in the same sample.
            list.Add(new OscillationDetector(spec));
            list.Add(new OffsetDetector(spec));
            list.Add(new ReversalDetector(spec));
            list.Add(new SaturationDetector(spec));
            // Advisers last: they read the findings of this sample and add figures, never findings.
            if (spec.Tuning.TiSeconds is null) list.Add(new ProportionalBandAdviser(spec));
            list.Add(new PerformanceAdviser(spec));
        }
        else
        {
            var cycles = new ShortCyclingDetector(spec);
            list.Add(cycles);
            list.Add(new DeadZoneAdviser(spec, cycles));
        }
        return list;
    }
}

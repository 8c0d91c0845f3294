using FsCheck.Xunit;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.OnOff;

public sealed class RescalingPropertyTests
{
    private static (LoopStatistics Stats, List<FindingChange> Changes, CycleFigures Figures) Run(double scale, double offset, bool[] on, int[] pv)
    {
        var spec = LoopRig.Define("on-off", "level", min: offset, max: offset + 100 * scale);
        var detector = new ShortCyclingDetector(spec);
        var changes = new List<FindingChange>();
        var board = new FindingBoard(spec.Id, changes.Add);
        // Each state held 20-59 s so that cycles of a few minutes come out.
        var t = 0L;
        for (var i = 0; i < on.Length; i++)
        {
            var hold = 20 + (pv.Length > 0 ? Math.Abs(pv[i % pv.Length]) % 40 : 0);
            for (var k = 0; k < hold; k++, t++)
            {
                var pct = pv.Length > 0 ? Math.Abs(pv[(i + k) % pv.Length]) % 100 : 50;
                detector.Step(new AlignedSample(LoopRig.At(t), offset + scale * pct, double.NaN, on[i] ? 100 : 0, double.NaN, LoopMode.Auto, true), board);
            }
        }
        return (detector.Fill(new LoopStatistics()), changes, detector.Figures);
    }

    private static bool Near(double? a, double? b) =>
        a is null ? b is null : b is not null && Math.Abs(a.Value - b.Value) <= 1e-9 * Math.Max(1, Math.Abs(a.Value));

    [Property]
    public bool RescaledPvWithItsRange_GivesTheSameOnOffFigures(bool[] on, int[] pv, byte scaleStep, short offset)
    {
        on ??= [];
        pv ??= [];
        var scale = 0.05 + scaleStep / 8.0;
        var a = Run(1, 0, on, pv);
        var b = Run(scale, offset, on, pv);
        return Near(a.Stats.CyclePeriodS, b.Stats.CyclePeriodS) && Near(a.Stats.StartsPerHour, b.Stats.StartsPerHour)
            && Near(a.Stats.DutyPct, b.Stats.DutyPct) && Near(a.Stats.CycleAmplitudePct, b.Stats.CycleAmplitudePct)
            && Near(a.Figures.AmplitudeTrendPct, b.Figures.AmplitudeTrendPct)
            && a.Changes.Select(c => c.Change).SequenceEqual(b.Changes.Select(c => c.Change))
            && a.Figures.Cycles >= 0 && (a.Stats.StartsPerHour ?? 0) >= 0 && (a.Stats.DutyPct ?? 0) is >= 0 and <= 100;
    }
}

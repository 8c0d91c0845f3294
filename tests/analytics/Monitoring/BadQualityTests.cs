using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Monitoring;

public sealed class BadQualityTests
{
    /// <summary>Runs every detector of the loop on <paramref name="samples"/>; returns the statistics and the changes.</summary>
    private static (LoopStatistics Stats, List<FindingChange> Changes) Run(Configuration.LoopSpec spec, IEnumerable<AlignedSample> samples)
    {
        var changes = new List<FindingChange>();
        var board = new FindingBoard(spec.Id, changes.Add);
        var detectors = DetectorSet.For(spec);
        foreach (var s in samples) foreach (var d in detectors) d.Step(s, board);
        var stats = new LoopStatistics();
        foreach (var d in detectors) stats = d.Fill(stats);
        return (stats, changes);
    }

    /// <summary>Good samples at whole seconds, and between them bad-quality ones holding the output but carrying wild PV values.</summary>
    private static IEnumerable<AlignedSample> WithBad(IReadOnlyList<AlignedSample> good, int every)
    {
        for (var i = 0; i < good.Count; i++)
        {
            yield return good[i];
            if (i % every != 0) continue;
            var g = good[i];
            yield return g with { Ticks = g.Ticks + TimeSpan.TicksPerSecond / 2, Pv = 1e6 * (i % 2 == 0 ? 1 : -1), PvGood = false };
        }
    }

    [Fact]
    public void PidLoop_BadQualitySamples_DoNotChangeStatisticsOrFindings()
    {
        var spec = LoopRig.Define("pid", "flow", mode: true);
        var good = new List<AlignedSample>();
        for (var s = 0; s < 3600; s++)
        {
            // Hunting output with saturation spells, PV stuck for a while, then out of range: every detector has work.
            var op = s % 600 < 200 ? 100 : 50 + 5 * Math.Sin(s * 0.7);
            var pv = s < 1200 ? 50 : s < 1500 ? 51 + 0.3 * Math.Sin(s * 0.1) : 103;
            good.Add(new AlignedSample(LoopRig.At(s), pv, 50, op, double.NaN, s % 900 < 100 ? LoopMode.Manual : LoopMode.Auto, true));
        }
        var clean = Run(spec, good);
        var dirty = Run(spec, WithBad(good, 3));
        // Quality practice: values flagged bad are held out of every statistic (OPC UA StatusCode Bad; common practice).
        Assert.Equal(clean.Stats, dirty.Stats);
        Assert.Equal(clean.Changes.Select(c => (c.Change, c.Finding)), dirty.Changes.Select(c => (c.Change, c.Finding)));
        Assert.NotEmpty(clean.Changes);
    }

    [Fact]
    public void OnOffLoop_BadQualitySamples_DoNotChangeStatisticsOrFindings()
    {
        var spec = LoopRig.Define("on-off", "level", min: 0, max: 3);
        var good = new List<AlignedSample>();
        for (var s = 0; s < 7200; s++)
        {
            var phase = s % 150;
            var pv = 1 + (phase < 75 ? phase : 150 - phase) * 0.004;
            good.Add(new AlignedSample(LoopRig.At(s), pv, double.NaN, phase < 40 ? 100 : 0, double.NaN, LoopMode.Unknown, true));
        }
        var clean = Run(spec, good);
        var dirty = Run(spec, WithBad(good, 2));
        Assert.Equal(clean.Stats, dirty.Stats);
        Assert.Equal(clean.Changes.Select(c => (c.Change, c.Finding)), dirty.Changes.Select(c => (c.Change, c.Finding)));
        Assert.Single(clean.Changes, c => c.Finding.Kind == FindingKinds.ShortCycling);
    }
}

using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.OnOff;

public sealed class WetWellTests
{
    private const double Area = 10, Stop = 0.5, Start = 0.7, PumpRate = 0.05;
    private const double Volume = Area * (Start - Stop);

    private static (LoopRig Rig, ShortCyclingDetector Detector) Run(double inflow, double hours)
    {
        var spec = LoopRig.Define("on-off", "level", min: 0, max: 3);
        var detector = new ShortCyclingDetector(spec);
        var rig = new LoopRig(spec, detector);
        SumpFeed.Run(new SumpModel(SumpFeed.Options(), Area, depth: 3, Stop, Start, PumpRate, inflow), rig, hours);
        return (rig, detector);
    }

    /// <summary>Pump cycle time of a wet well: fill V/Qin plus empty V/(Qp - Qin) (pump-station design rule, wastewater pumping handbooks).</summary>
    private static double CycleSeconds(double inflow) => Volume / inflow + Volume / (PumpRate - inflow);

    [Theory]
    [InlineData(0.2)]
    [InlineData(0.35)]
    [InlineData(0.5)]
    [InlineData(0.8)]
    public void StartsPerHour_MatchTheWetWellCycleTime(double inflowShare)
    {
        var inflow = inflowShare * PumpRate;
        var (_, detector) = Run(inflow, 3);
        var f = detector.Figures;
        var expected = 3600 / CycleSeconds(inflow);
        Assert.InRange(f.StartsPerHour!.Value, expected * 0.98, expected * 1.02);
        // Mass balance: the pump runs Qin/Qp of the time (same design rule).
        Assert.InRange(f.DutyPct!.Value, inflowShare * 100 - 1, inflowShare * 100 + 1);
    }

    [Fact]
    public void InflowHalfThePumpRate_GivesTheShortestCycleFourVOverQp_AndShortCycling()
    {
        var inflow = PumpRate / 2;
        var (rig, detector) = Run(inflow, 2);
        // Pump-station design rule: the cycle is shortest, 4V/Qp, when the inflow is half the pump rate.
        Assert.Equal(4 * Volume / PumpRate, CycleSeconds(inflow), 9);
        var expected = 3600 / (4 * Volume / PumpRate);
        Assert.InRange(detector.Figures.StartsPerHour!.Value, expected * 0.98, expected * 1.02);
        // 22.5 starts an hour is above the level default of 10 (pump motors, 6-15 an hour commonly quoted; common practice, no source).
        var f = Assert.IsType<ShortCyclingFinding>(Assert.Single(rig.Raised(FindingKinds.ShortCycling)));
        Assert.True(f.StartsPerHour > rig.Spec.Limits.MaxStartsPerHour);
        Assert.Equal(10, f.MaxStartsPerHour);
        Assert.InRange(f.CyclePeriodS, 160 * 0.98, 160 * 1.02);
        Assert.Contains("dead zone", f.Diagnosis);
        Assert.True(rig.Monitor.Board.IsActive(FindingKinds.ShortCycling));
        var stats = rig.Monitor.Statistics();
        Assert.Equal(detector.Figures.StartsPerHour, stats.StartsPerHour);
        Assert.NotNull(stats.CycleAmplitudePct);
    }

    [Fact]
    public void LowInflow_BelowTheLimit_RaisesNoShortCycling()
    {
        var inflow = 0.1 * PumpRate;
        var (rig, detector) = Run(inflow, 4);
        // 3600 / (V/Qin + V/(Qp - Qin)) = 8.1 starts an hour, below the limit of 10 (design rule above).
        Assert.True(detector.Figures.StartsPerHour < rig.Spec.Limits.MaxStartsPerHour);
        Assert.Empty(rig.Raised(FindingKinds.ShortCycling));
    }

    [Fact]
    public void InflowFalls_ShortCyclingEndsOnceStartsDropBelowTheLimit()
    {
        var spec = LoopRig.Define("on-off", "level", min: 0, max: 3);
        var detector = new ShortCyclingDetector(spec);
        var rig = new LoopRig(spec, detector);
        var options = SumpFeed.Options();
        var fast = new SumpModel(options, Area, depth: 3, Stop, Start, PumpRate, PumpRate / 2);
        var slow = new SumpModel(options, Area, depth: 3, Stop, Start, PumpRate, PumpRate * 0.05);
        // One hour at Qin = Qp/2 (22.5 starts an hour), then three at Qin = Qp/20 (3600 / (800 + 42) = 4.3 an hour; design rule above).
        for (long s = 0; s < 4 * 3600; s++)
        {
            var sump = s < 3600 ? fast : slow;
            for (var k = 0; k < 10; k++) sump.Step(s + k * 0.1, 0.1);
            rig.Feed(s, sump.Reading.Pv, double.NaN, sump.Reading.Op);
        }
        Assert.Single(rig.Raised(FindingKinds.ShortCycling));
        var ended = Assert.Single(rig.Ended(FindingKinds.ShortCycling));
        Assert.True(ended.End > ended.Start);
        Assert.False(rig.Monitor.Board.IsActive(FindingKinds.ShortCycling));
        Assert.InRange(detector.Figures.StartsPerHour!.Value, 4.3 * 0.98, 4.3 * 1.04);
    }
}

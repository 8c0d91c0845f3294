using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.DeadZone;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Tests.OnOff;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.DeadZone;

public sealed class DeadZoneAdviserTests
{
    private const double Area = 10, Stop = 0.5, Start = 0.7, PumpRate = 0.05;

    private static (DeadZoneAdvice Advice, ShortCyclingDetector Cycles) Run(double inflow, double hours, double stop = Stop, double start = Start)
    {
        var spec = LoopRig.Define("on-off", "level", min: 0, max: 3);
        var cycles = new ShortCyclingDetector(spec);
        var adviser = new DeadZoneAdviser(spec, cycles);
        var rig = new LoopRig(spec, cycles, adviser);
        SumpFeed.Run(new SumpModel(SumpFeed.Options(), Area, depth: 3, stop, start, PumpRate, inflow, noiseSigma: 0.002, seed: 5), rig, hours);
        return (rig.Monitor.Statistics().Advice!.Value.DeadZone!, cycles);
    }

    /// <summary>Wet-well cycle time V/Qin + V/(Qp - Qin) (the standard wet-well sizing relation of wastewater pumping handbooks; from memory).</summary>
    private static double CycleSeconds(double inflow, double band) => Area * band / inflow + Area * band / (PumpRate - inflow);

    [Theory]
    [InlineData(0.2)]
    [InlineData(0.35)]
    [InlineData(0.5)]
    [InlineData(0.8)]
    public void Rates_dead_zone_and_cycle_time_match_the_wet_well_rule_within_3_percent(double inflowShare)
    {
        var inflow = inflowShare * PumpRate;
        var (a, _) = Run(inflow, 3);
        Assert.True(a.Shown, a.NotShownBecause);
        // Mass balance of the well: the level rises at Qin/A while the pump is off and falls at (Qp - Qin)/A while it runs.
        Assert.InRange(a.RateOffPerMin, 0.97 * inflow / Area * 60, 1.03 * inflow / Area * 60);
        Assert.InRange(-a.RateOnPerMin, 0.97 * (PumpRate - inflow) / Area * 60, 1.03 * (PumpRate - inflow) / Area * 60);
        Assert.InRange(a.DeadZone, 0.97 * (Start - Stop), 1.03 * (Start - Stop));
        var expected = CycleSeconds(inflow, Start - Stop);
        Assert.InRange(a.CycleMin * 60, 0.97 * expected, 1.03 * expected);
        // The worked steps are the page's own arithmetic on its rounded figures.
        Assert.Equal(a.DeadZone / Math.Abs(a.RateOffPerMin) + a.DeadZone / Math.Abs(a.RateOnPerMin), a.CycleMin, a.CycleMin * 1e-3);
        Assert.Equal(60 / a.CycleMin, a.StartsPerHour, a.StartsPerHour * 1e-3);
        Assert.Contains(LoopWatch.Analytics.Advice.AdviceCaution.Text, a.Caution);
    }

    [Fact]
    public void At_half_the_pump_rate_the_cycle_is_four_V_over_Qp_and_the_worst_case_band_sizes_the_well()
    {
        var (a, _) = Run(PumpRate / 2, 2);
        var volume = Area * (Start - Stop);
        // Wet-well rule: the shortest cycle, 4V/Qp, comes when the inflow is half the pump rate (handbook relation above).
        Assert.InRange(a.CycleMin * 60, 0.97 * 4 * volume / PumpRate, 1.03 * 4 * volume / PumpRate);
        // Sizing the same rule the other way: V = Qp T_min / 4 for T_min = 3600 / 10 starts an hour, so D = V / A.
        var band = PumpRate * 360 / 4 / Area;
        Assert.InRange(a.WorstInflowDeadZone!.Value, 0.97 * band, 1.03 * band);
        Assert.InRange(a.NarrowestDeadZone, 0.97 * band, 1.03 * band);
    }

    [Fact]
    public void The_narrowest_dead_zone_run_on_the_simulated_well_gives_the_limit_of_starts_per_hour()
    {
        var inflow = 0.35 * PumpRate;
        var (a, _) = Run(inflow, 2);
        Assert.True(a.StartsPerHour > a.MaxStartsPerHour);
        // Widen the band about its middle to the advised width and run the same well again.
        var middle = (a.PvAtStart + a.PvAtStop) / 2;
        var (_, cycles) = Run(inflow, 4, middle - a.NarrowestDeadZone / 2, middle + a.NarrowestDeadZone / 2);
        Assert.InRange(cycles.Figures.StartsPerHour!.Value, 0.97 * a.MaxStartsPerHour, 1.03 * a.MaxStartsPerHour);
    }

    [Fact]
    public void Before_three_on_and_off_periods_it_says_what_it_waits_for()
    {
        var (a, _) = Run(0.1 * PumpRate, 0.1);
        Assert.False(a.Shown);
        Assert.Contains("waiting", a.NotShownBecause);
        Assert.Contains("not shown", Assert.Single(a.Explanation));
    }
}

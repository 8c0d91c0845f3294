using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Oscillation;
using LoopWatch.Analytics.Offset;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Scenario;

/// <summary>The demo plant's placed faults, run for two simulated hours through the real detectors.</summary>
public sealed class DemoScenarioTests
{
    private static readonly Lazy<Dictionary<string, (LoopMonitor Monitor, List<Finding> Seen)>> Run = new(() =>
    {
        var plant = new DemoPlant();
        var errors = new List<string>();
        var specs = LoopOptionsCheck.Check(plant.Configuration, errors);
        Assert.Empty(errors);
        var result = new Dictionary<string, (LoopMonitor, List<Finding>)>();
        var cells = specs.Select(s =>
        {
            var seen = new List<Finding>();
            var monitor = new LoopMonitor(s, c => { if (c.Change != FindingChangeKind.Ended) seen.Add(c.Finding); });
            result[s.Id] = (monitor, seen);
            return monitor;
        }).ToArray();
        var t0 = new DateTime(2026, 3, 2, 0, 0, 0, DateTimeKind.Utc).Ticks;
        for (var second = 1; second <= 7200; second++)
        {
            plant.Step();
            var ticks = t0 + second * TimeSpan.TicksPerSecond;
            for (var i = 0; i < cells.Length; i++)
            {
                var r = plant.Loops[i].Reading;
                var m = cells[i];
                m.Update(Signal.Pv, ticks, r.Pv);
                if (m.Spec.SpTag is not null) m.Update(Signal.Sp, ticks, r.Sp);
                if (m.Spec.ModeTag is not null) m.Update(Signal.Mode, ticks, (double)r.Mode);
                if (m.Spec.PositionTag is not null) m.Update(Signal.Position, ticks, r.Position);
                m.Update(Signal.Op, ticks, m.Spec.Kind == LoopKind.OnOff ? (r.Op > 50 ? 1 : 0) : r.Op);
            }
        }
        return result;
    });

    private static IEnumerable<string> Kinds(string id) => Run.Value[id].Seen.Select(f => f.Kind).Distinct();

    [Theory]
    [InlineData("FIC-101")]
    [InlineData("TIC-401")]
    [InlineData("LIC-105")]
    [InlineData("FIC-104")]
    public void Healthy_loops_raise_nothing(string id) => Assert.Empty(Kinds(id));

    [Fact]
    public void The_proportional_only_loop_keeps_an_offset_from_missing_integral_action()
    {
        // Seborg, Edgar and Mellichamp: P-only offset = Kp * load / (1 + Kc Kp) = 9 / 3 = 3 % of span for PIC-201.
        var offset = Run.Value["PIC-201"].Seen.OfType<OffsetFinding>().Last();
        Assert.Equal(3.0, offset.OffsetPct, 0.2);
        Assert.Equal(OffsetCauses.NoIntegralAction, offset.Cause);
        Assert.Equal([FindingKinds.SustainedOffset], Kinds("PIC-201"));
    }

    [Fact]
    public void The_narrow_dead_zone_sump_short_cycles()
    {
        // Wet-well rule V/Qin + V/(Qp - Qin): V = 3 m2 x 0.4 m = 1.2 m3, Qp = 0.04, Qin about 0.02 m3/s gives 120 s, 30 starts/h.
        Assert.Contains(FindingKinds.ShortCycling, Kinds("LIC-301"));
        var stats = Run.Value["LIC-301"].Monitor.Statistics();
        Assert.InRange(stats.StartsPerHour!.Value, 20, 40);
    }

    [Fact]
    public void The_sticky_valve_oscillates_with_a_stiction_hint()
    {
        var osc = Run.Value["FIC-102"].Monitor.Board.Active.OfType<OscillationFinding>().SingleOrDefault();
        Assert.NotNull(osc);
        // Horch (1999): a sticky valve gives an odd cross-correlation of output and PV.
        Assert.Equal(CauseHints.Stiction, osc.CauseHint);
        Assert.True(osc.AmplitudePct >= 1, $"{osc}");
    }

    [Fact]
    public void The_aggressive_loop_oscillates_with_a_tuning_hint()
    {
        var osc = Run.Value["TIC-202"].Monitor.Board.Active.OfType<OscillationFinding>().SingleOrDefault();
        Assert.NotNull(osc);
        Assert.Equal(CauseHints.TuningOrDisturbance, osc.CauseHint); // Horch (1999): even cross-correlation
    }

    [Fact]
    public void The_noisy_measurement_makes_the_valve_hunt_without_an_oscillation_finding()
    {
        Assert.Contains(FindingKinds.ExcessiveReversals, Kinds("PIC-103"));
        Assert.DoesNotContain(FindingKinds.Oscillation, Kinds("PIC-103"));
    }

    [Fact]
    public void The_sump_advice_redoes_by_hand_and_matches_the_wet_well()
    {
        var a = Run.Value["LIC-301"].Monitor.Statistics().Advice!.Value.DeadZone!;
        Assert.True(a.Shown, a.NotShownBecause);
        // LIC-301: 3 m2 well, Qin 0.02 and Qp 0.04 m3/s: the level rises at Qin/A = 0.4 m/min and falls at (Qp - Qin)/A = 0.4 m/min (mass balance).
        Assert.InRange(a.RateOffPerMin, 0.4 * 0.95, 0.4 * 1.05);
        Assert.InRange(-a.RateOnPerMin, 0.4 * 0.95, 0.4 * 1.05);
        // The page's working, redone from its own printed figures.
        Assert.Equal(Math.Abs(a.PvAtStart - a.PvAtStop), a.DeadZone, 1e-3);
        var cycle = a.DeadZone / a.RateOffPerMin + a.DeadZone / -a.RateOnPerMin;
        Assert.Equal(cycle, a.CycleMin, 1e-3 * cycle);
        Assert.Equal(60 / a.CycleMin, a.StartsPerHour, 1e-3 * a.StartsPerHour);
        Assert.Equal(60 / a.MaxStartsPerHour, a.TargetCycleMin, 1e-3);
        var narrowest = a.TargetCycleMin / (1 / a.RateOffPerMin + 1 / -a.RateOnPerMin);
        Assert.Equal(narrowest, a.NarrowestDeadZone, 1e-3 * narrowest);
        Assert.Equal(a.NarrowestDeadZone / 3 * 100, a.SwingPctOfSpan, 0.01);
        // Wet-well rule: V/Qin + V/(Qp - Qin) with V = 3 m2 x 0.4 m gives 120 s (30 starts/h); the prediction agrees with the measured cycles within 3 %.
        Assert.InRange(a.StartsPerHour, 0.97 * a.MeasuredStartsPerHour!.Value, 1.03 * a.MeasuredStartsPerHour.Value);
        // At most 10 starts/h needs a 6 min cycle: D = 6 / (1/0.4 + 1/0.4) = 1.2 m.
        Assert.InRange(a.NarrowestDeadZone, 1.2 * 0.95, 1.2 * 1.05);
    }

    [Fact]
    public void The_proportional_only_advice_redoes_by_hand_and_matches_the_textbook()
    {
        var a = Run.Value["PIC-201"].Monitor.Statistics().Advice!.Value.OffsetWhatIf!;
        Assert.True(a.Shown, a.NotShownBecause);
        // PIC-201 is simulated with Kp = 1 and PB 50 %: Seborg, Edgar and Mellichamp give offset = Kp M / (1 + Kc Kp) = 9 / 3 = 3 % of span.
        Assert.InRange(a.ProcessGain, 0.97, 1.03);
        Assert.Equal(50, a.PbPct);
        Assert.Equal(3.0, a.OffsetPct, 0.15);
        Assert.Equal(a.OffsetPct * (1 + a.Kc!.Value * a.ProcessGain), a.LoadEffectPct, 1e-3 * a.LoadEffectPct);
        foreach (var row in a.Rows!)
            Assert.Equal(a.LoadEffectPct / (1 + 100 / row.PbPct * a.ProcessGain), row.OffsetPct, 2e-3 * row.OffsetPct);
        // First order plus dead time, tau 20 s, theta 3 s: the phase crossover w solves 3w + atan(20w) = pi (Bode stability criterion).
        var w = a.UltimateOmega!.Value;
        Assert.Equal(Math.PI, 3 * w + Math.Atan(20 * w), 1e-3);
        Assert.Equal(Math.Sqrt(1 + 400 * w * w) / a.ProcessGain, a.UltimateKc!.Value, 1e-3 * a.UltimateKc.Value);
        Assert.Contains(a.Rows, r => r.Oscillates);
    }

    [Fact]
    public void The_performance_index_of_the_demo_redoes_by_hand()
    {
        var a = Run.Value["PIC-201"].Monitor.Statistics().Advice!.Value.Performance!;
        Assert.True(a.Shown, a.NotShownBecause);
        Assert.Equal(3, a.DelaySamples); // DeadTimeSeconds 3 at 1 s a sample
        // Harris (1989): sigma_mv^2 = sigma_a^2 (psi_0^2 + psi_1^2 + psi_2^2), index = 1 - sigma_mv^2 / sigma_y^2.
        Assert.Equal(a.InnovationStdPct * Math.Sqrt(a.Impulse!.Sum(p => p * p)), a.MinimumStdPct, 1e-3 * a.MinimumStdPct);
        Assert.Equal(1 - Math.Pow(a.MinimumStdPct / a.ErrorStdPct, 2), a.Index, 1e-3);
        Assert.InRange(a.Index, 0, 1);
        // The loop tuned near its ultimate gain is far from minimum variance.
        Assert.True(Run.Value["TIC-202"].Monitor.Statistics().Advice!.Value.Performance!.Index > 0.5);
    }
}

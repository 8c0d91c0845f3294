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
    public void Print_advice()
    {
        foreach (var id in new[] { "LIC-301", "PIC-201", "TIC-202", "FIC-101" })
        {
            var a = Run.Value[id].Monitor.Statistics().Advice;
            if (a is null) { Console.WriteLine($"{id}: none"); continue; }
            foreach (var r in a.Value.All()) { Console.WriteLine($"{id} {r.Headline}"); foreach (var l in r.Explanation) Console.WriteLine("   " + l); }
        }
    }
}

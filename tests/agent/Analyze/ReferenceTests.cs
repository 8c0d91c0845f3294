using System.Globalization;
using System.Text;
using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Tests.Analyze;

/// <summary>Published references through the CLI on files written by the test.</summary>
public sealed class ReferenceTests
{
    private static LoopOptions Pid(string id, string process, double max) => new()
    {
        Id = id, Description = $"{id} reference loop", Area = "Reference", Kind = "pid", Process = process,
        Pv = new SignalOptions { Tag = $"ref/{id}/pv", Min = 0, Max = max, Unit = "u" },
        Sp = new SignalOptions { Tag = $"ref/{id}/sp" },
        Op = new SignalOptions { Tag = $"ref/{id}/op" },
    };

    [Theory]
    [InlineData(2.0, 1.0, -9.0)]
    [InlineData(1.0, 1.5, -8.0)]
    public async Task Proportional_only_control_after_a_load_step_holds_the_offset_of_the_closed_loop_formula(double kc, double kp, double load)
    {
        var options = Pid("PIC-701", "pressure", 10);
        var model = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = kc, TiSeconds = null, ProcessGain = kp, TauSeconds = 20, DeadTimeSeconds = 3, SetPointPct = 55, LoadSteps = [(600, load)],
        });
        var rec = PlantRecording.Of([model], seconds: 3600);
        using var run = new AnalyzeRun();
        var report = await run.Json(run.File("loops.json", rec.ConfigJson()), run.File("pic701.csv", rec.LongCsv()));
        var offset = AnalyzeRun.Loop(report, "PIC-701").GetProperty("findings").EnumerateArray()
            .Single(f => f.GetProperty("kind").GetString() == "sustained-offset");
        // Seborg, Edgar & Mellichamp, Process Dynamics and Control, P-only control of a first-order process: the load
        // offset is Kp*L/(1 + Kc*Kp); error SP - PV is positive when a negative load pulls PV below SP.
        var expected = -kp * load / (1 + kc * kp);
        Assert.Equal(expected, offset.GetProperty("offset_pct").GetDouble(), 0.05);
        Assert.Equal("no-integral-action", offset.GetProperty("cause").GetString()); // the output is free to move: missing integral action
        Assert.True(offset.GetProperty("end").ValueKind == System.Text.Json.JsonValueKind.Null, "still active at the end of the file");
    }

    [Fact]
    public async Task A_triangle_output_reverses_twice_a_period_and_travels_its_path_length()
    {
        // OP a triangle 30..70 % with a 60 s period for one hour at 1 s; PV and SP steady.
        const double low = 30, high = 70, period = 60;
        var options = Pid("FIC-702", "flow", 100);
        var csv = new StringBuilder("timestamp,tag,value\n");
        for (var t = 0; t < 3600; t++)
        {
            var phase = t % period / period;
            var op = phase < 0.5 ? low + (high - low) * phase * 2 : high - (high - low) * (phase - 0.5) * 2;
            var at = PlantRecording.Stamp(PlantRecording.Start.AddSeconds(t));
            csv.Append(CultureInfo.InvariantCulture, $"{at},ref/FIC-702/pv,50\n{at},ref/FIC-702/sp,50\n{at},ref/FIC-702/op,{op:R}\n");
        }
        using var run = new AnalyzeRun();
        // Limit 60 reversals an hour, so the detector's finding can be checked too (119 an hour is above it).
        var config = PlantRecording.ConfigFor([options], _ => new { MaxReversalsPerHour = 60 });
        var report = await run.Json(run.File("loops.json", config), run.File("fic702.csv", csv.ToString()));
        var stats = AnalyzeRun.Loop(report, "FIC-702").GetProperty("stats");
        Assert.Contains(AnalyzeRun.Loop(report, "FIC-702").GetProperty("findings").EnumerateArray(), f => f.GetProperty("kind").GetString() == "excessive-reversals");
        // A triangle wave turns twice per period (geometry, exact): turning points at 30, 60, ..., 3570 s; the start is no reversal.
        Assert.Equal(119, stats.GetProperty("reversals").GetInt64());
        Assert.Equal(119, stats.GetProperty("reversals_per_hour").GetDouble(), 1e-9);
        // Path length of the triangle: 3599 one-second moves of (70 - 30) / 30 % each (geometry, exact).
        Assert.Equal(3599 * (high - low) / (period / 2), stats.GetProperty("travel_pct").GetDouble(), 1e-6);
        Assert.Equal(0, stats.GetProperty("mean_error_pct").GetDouble(), 1e-12);
    }

    [Theory]
    [InlineData(0.015, 0.04)]
    [InlineData(0.02, 0.05)]
    public async Task A_wet_well_pump_cycles_with_the_period_of_the_pump_station_rule(double inflow, double pumpRate)
    {
        // A 3 m2 wet well switching between 1.0 m (stop) and 1.4 m (start): V = 1.2 m3 between the levels.
        const double area = 3, stop = 1.0, start = 1.4;
        var options = new LoopOptions
        {
            Id = "LIC-703", Description = "reference wet well", Area = "Reference", Kind = "on-off", Process = "level",
            Pv = new SignalOptions { Tag = "ref/LIC-703/pv", Min = 0, Max = 3, Unit = "m" },
            Op = new SignalOptions { Tag = "ref/LIC-703/op" },
        };
        var sump = new SumpModel(options, area, depth: 3, stopLevel: stop, startLevel: start, pumpRate: pumpRate, inflow: inflow);
        // Steps of 0.05 s so the simulated switch lags the level by little; the file still has one row per tag and second.
        var rec = PlantRecording.Of([sump], seconds: 7200, substeps: 20);
        using var run = new AnalyzeRun();
        var report = await run.Json(run.File("loops.json", rec.ConfigJson()), run.File("lic703.csv", rec.LongCsv()));
        var stats = AnalyzeRun.Loop(report, "LIC-703").GetProperty("stats");
        // Pump-station design rule: cycle time T = V/Qin + V/(Qp - Qin); the pump runs V/(Qp - Qin) of it.
        var v = area * (start - stop);
        var cycle = v / inflow + v / (pumpRate - inflow);
        // Tolerances: starts fall on whole seconds of the 1 s samples, and the first and last cycles are cut by the file's ends.
        Assert.Equal(cycle, stats.GetProperty("cycle_period_s").GetDouble(), 0.5);
        Assert.Equal(3600 / cycle, stats.GetProperty("starts_per_hour").GetDouble(), 0.6);
        Assert.Equal(100 * v / (pumpRate - inflow) / cycle, stats.GetProperty("duty_pct").GetDouble(), 1.0);
        Assert.Equal(sump.Starts, stats.GetProperty("starts").GetInt64());
        // Above the level default of 10 starts an hour (README, limit defaults): short cycling, and the agent would have raised its alarm.
        var loop = AnalyzeRun.Loop(report, "LIC-703");
        Assert.Contains(loop.GetProperty("findings").EnumerateArray(), f => f.GetProperty("kind").GetString() == "short-cycling");
        Assert.Contains(loop.GetProperty("alarms").EnumerateArray(), a => a.GetProperty("kind").GetString() == "short-cycling" && a.GetProperty("activations").GetInt32() >= 1);
    }
}

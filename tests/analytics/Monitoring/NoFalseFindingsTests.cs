using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Monitoring;

public sealed class NoFalseFindingsTests
{
    private static readonly string[] Ours =
        [FindingKinds.ShortCycling, FindingKinds.ExcessiveReversals, FindingKinds.Saturation, FindingKinds.Frozen, FindingKinds.OutOfRange];

    [Fact]
    public void HealthyOnOffHeater_WithinItsStartLimit_RaisesNone()
    {
        var spec = LoopRig.Define("on-off", "temperature", min: 0, max: 120);
        var rig = new LoopRig(spec);
        var options = new LoopOptions { Id = "TS-420", Kind = "on-off", Pv = new SignalOptions { Tag = "u4/ts420/pv", Min = 0, Max = 120 } };
        // Hot-water tank on a 4 K differential (58-62 deg C) with a little measurement noise.
        var heater = new HeaterModel(options, ambient: 15, rise: 60, tau: 900, deadTime: 20, low: 58, high: 62, noiseSigma: 0.05, seed: 4);
        for (var s = 0; s < 4 * 3600; s++)
        {
            heater.Step(s, 1);
            rig.Feed(s, heater.Reading.Pv, double.NaN, heater.Reading.Op);
        }
        var stats = rig.Monitor.Statistics();
        // Contactor-switched heaters: up to 30 starts an hour is the temperature default (common practice, no source).
        Assert.NotNull(stats.StartsPerHour);
        Assert.InRange(stats.StartsPerHour!.Value, 1, spec.Limits.MaxStartsPerHour * 0.8);
        Assert.Empty(rig.RaisedAny(Ours));
    }

    [Fact]
    public void HealthyNoisyPiLoop_NoiseBelowTheDeadband_RaisesNone()
    {
        var spec = LoopRig.Define("pid", "flow", min: 0, max: 250, mode: true);
        var detector = new ReversalDetector(spec);
        var rig = new LoopRig(spec, [.. Analytics.Monitoring.DetectorSet.For(spec).Where(d => d is not ReversalDetector), detector]);
        var options = new LoopOptions { Id = "FIC-120", Kind = "pid", Pv = new SignalOptions { Tag = "u3/fic120/pv", Min = 0, Max = 250 } };
        // Flow loop, Kc 0.5 and Ti 8 s on a 5 s lag, 0.15 % of span white noise (a good flow transmitter) and load changes.
        var loop = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = 0.5, TiSeconds = 8, TauSeconds = 5, DeadTimeSeconds = 1, NoiseSigmaPct = 0.15, LoadAmplitudePct = 5, Seed = 11,
        });
        for (var s = 0; s < 3 * 3600; s++)
        {
            loop.Step(s, 1);
            var r = loop.Reading;
            rig.Feed(s, r.Pv, r.Sp, r.Op, r.Mode);
        }
        var stats = rig.Monitor.Statistics();
        Assert.True(stats.ReversalsPerHour < spec.Limits.MaxReversalsPerHour / 2, $"{stats.ReversalsPerHour} reversals an hour");
        Assert.Equal(0, stats.SaturatedPct!.Value, 9);
        Assert.Equal(100, stats.TimeInAutoPct!.Value, 9);
        Assert.Empty(rig.RaisedAny(Ours));
    }
}

using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Offset;
using LoopWatch.Analytics.Tests.Oscillation;

namespace LoopWatch.Analytics.Tests.Offset;

public class OffsetDetectorTests
{
    private static PidLoopRig RunLoad(double kc, double? ti, double loadPct, long seconds = 2400, (double, double)[]? steps = null, double noise = 0)
    {
        var options = PidLoopRig.Options("flow", ti: ti, kc: kc);
        var rig = new PidLoopRig(PidLoopRig.Check(options));
        var loop = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = kc, TiSeconds = ti, ProcessGain = 1, TauSeconds = 10, DeadTimeSeconds = 1,
            LoadSteps = steps ?? [(600, loadPct)], NoiseSigmaPct = noise, NoiseFilterSeconds = 3, Seed = 4,
        });
        rig.Run(loop, seconds);
        return rig;
    }

    [Theory]
    [InlineData(2.0, 15.0)]
    [InlineData(1.0, 8.0)]
    [InlineData(4.0, 20.0)]
    public void ProportionalOnly_LoadStep_OffsetIsChangeOver1PlusKcKp(double kc, double load)
    {
        var rig = RunLoad(kc, null, load, noise: 0.2);

        var finding = rig.Active<OffsetFinding>();
        Assert.NotNull(finding);
        // Seborg, Edgar & Mellichamp, Process Dynamics and Control: P-only offset = open-loop change / (1 + Kc Kp), Kp = 1;
        // a load raising PV gives SP - PV negative.
        Assert.Equal(-load / (1 + kc * 1), finding.OffsetPct, 0.2);
        Assert.Equal(OffsetCauses.NoIntegralAction, finding.Cause);
        Assert.Contains("integral action", finding.Diagnosis);
        // Raised once the offset had lasted Limits:OffsetMinSeconds (flow default 300 s) after the step at 600 s.
        var raised = rig.Raised<OffsetFinding>().Single();
        Assert.InRange(raised.DurationS, 300, 320);
        Assert.InRange(raised.Start, At(600), At(660));
    }

    [Fact]
    public void PiControl_SameLoadStep_NoFinding()
    {
        var rig = RunLoad(2.0, 20, 15, noise: 0.2);

        // Integral action removes the steady-state offset of a step load (Seborg, Edgar & Mellichamp).
        Assert.DoesNotContain(rig.Changes, c => c.Finding.Kind == FindingKinds.SustainedOffset);
    }

    [Fact]
    public void PiControl_LoadTheValveCannotMatch_CauseOutputSaturated()
    {
        var rig = RunLoad(1.0, 20, -60);

        var finding = rig.Active<OffsetFinding>();
        Assert.NotNull(finding);
        // The valve would need 50 + 60 = 110 %: it sits at 100 % and PV settles at 100 - 60 = 40 % (steady-state gain 1), SP - PV = +10.
        Assert.Equal(10, finding.OffsetPct, 0.2);
        Assert.Equal(OffsetCauses.OutputSaturated, finding.Cause);
        Assert.Contains("actuator or capacity", finding.Diagnosis);
        Assert.True(finding.SaturatedPct > 90);
    }

    [Fact]
    public void LoadRemoved_EndsTheFinding()
    {
        var rig = RunLoad(2.0, null, 15, seconds: 2400, steps: [(600, 15), (1500, 0)]);

        var ended = rig.Changes.Where(c => c.Change == FindingChangeKind.Ended).Select(c => c.Finding).OfType<OffsetFinding>().Single();
        // With the load gone, P-only control returns to SP exactly (bias equals the load-free output); ends within the band after 60 s.
        Assert.InRange(ended.End!.Value, At(1500), At(1600));
        Assert.Null(rig.Active<OffsetFinding>());
    }

    [Fact]
    public void SetPointRamp_InPiLoop_NoOffsetWhileMoving()
    {
        var options = PidLoopRig.Options("flow", ti: 30, kc: 1);
        var spec = PidLoopRig.Check(options);
        var rig = new PidLoopRig(spec);
        var process = new FirstOrderDeadTime(1, 10, 1, 1, 20, 20);
        var controller = new PiController(1, 30, 20);
        var pv = 20.0;
        for (var t = 0; t < 1200; t++)
        {
            // 0.1 %/s for 600 s: a PI loop on a self-regulating process lags a ramp by rate * Ti / (Kc Kp) = 3 % (Seborg et al., ramp response of a type-1 loop).
            var sp = t < 600 ? 20 + 0.1 * t : 80;
            var op = controller.Step(sp, pv, 1);
            pv = process.Step(op);
            rig.Feed(t, pv, sp, op);
        }

        // A set point in motion is held off (settle time after each move): no offset although |e| > 2 % for 600 s.
        Assert.DoesNotContain(rig.Changes, c => c.Finding.Kind == FindingKinds.SustainedOffset);
    }

    private static DateTimeOffset At(double second) => new DateTimeOffset(PidLoopRig.T0, TimeSpan.Zero).AddSeconds(second);
}

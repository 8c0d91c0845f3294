using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Tests.Monitoring;

namespace LoopWatch.Analytics.Tests.OnOff;

public sealed class RelayFeedbackTests
{
    [Theory]
    [InlineData(60, 12)]
    [InlineData(30, 15)]
    [InlineData(20, 40)]
    public void IdealRelayOnFirstOrderDeadTime_CyclePeriodAndAmplitudeMatchTheRelayFeedbackAnalysis(double tau, double deadTime)
    {
        const double dt = 0.1, d = 1, k = 1;
        var spec = LoopRig.Define("on-off", "temperature", min: -1, max: 1, limits: new LimitOptions { SampleSeconds = dt });
        var detector = new ShortCyclingDetector(spec);
        var rig = new LoopRig(spec, detector);
        var process = new FirstOrderDeadTime(k, tau, deadTime, dt);
        // Ideal symmetric relay (no hysteresis) around zero: on below the set point, off above it.
        var relay = new OnOffController(0, 0, directActing: false);
        var expected = 2 * tau * Math.Log(2 * Math.Exp(deadTime / tau) - 1);
        var steps = (long)(40 * expected / dt);
        var y = 0.0;
        for (long i = 0; i < steps; i++)
        {
            var on = relay.Step(y);
            rig.Feed(i * dt, y, double.NaN, on ? 100 : 0);
            y = process.Step(on ? d : -d);
        }
        var f = detector.Figures;
        // Relay feedback on K e^(-Ls)/(Ts+1), the analysis behind Astrom and Hagglund's relay auto-tuning:
        // T_p = 2T ln(2 e^(L/T) - 1), and the output swings a = K d (1 - e^(-L/T)) about the set point.
        Assert.InRange(f.PeriodS!.Value, expected * 0.98, expected * 1.02);
        Assert.InRange(f.StartsPerHour!.Value, 3600 / expected * 0.98, 3600 / expected * 1.02);
        var amplitudePct = k * d * (1 - Math.Exp(-deadTime / tau)) / spec.Span * 100;
        Assert.InRange(f.AmplitudePct!.Value, amplitudePct * 0.98, amplitudePct * 1.02);
        // A symmetric relay spends half of each cycle on (symmetry of the analysis).
        Assert.InRange(f.DutyPct!.Value, 49, 51);
    }
}

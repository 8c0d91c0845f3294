using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Offset;
using LoopWatch.Analytics.Oscillation;

namespace LoopWatch.Analytics.Tests.Oscillation;

public class RescalingTests
{
    // Traces in % of span: a sticking valve's limit cycle, then a P-only loop holding an offset after a load step.
    private static readonly Lazy<(double Pv, double Sp, double Op)[]> Trace = new(Record);

    [Theory]
    [InlineData(1.0, 0.0)]
    [InlineData(0.001, -5.0)]
    [InlineData(2.5, 273.15)]
    [InlineData(1e4, -3e5)]
    [InlineData(0.37, 12.0)]
    public void ScalingPvSpAndRangeTogether_LeavesFindingsUnchanged(double scale, double offset)
    {
        var baseline = Feed(1.0, 0.0);
        var scaled = Feed(scale, offset);

        // Findings are made in % of span, so a change of engineering units changes nothing (definition of % of span);
        // only float rounding differs, hence the small tolerances.
        Assert.Contains(baseline, c => c.Finding is OscillationFinding);
        Assert.Contains(baseline, c => c.Finding is OffsetFinding);
        Assert.Equal(baseline.Count, scaled.Count);
        for (var i = 0; i < baseline.Count; i++)
        {
            var (a, b) = (baseline[i], scaled[i]);
            Assert.Equal(a.Change, b.Change);
            Assert.Equal(a.Finding.Kind, b.Finding.Kind);
            Assert.Equal(a.Finding.Start, b.Finding.Start);
            Assert.Equal(a.Finding.End, b.Finding.End);
            switch (a.Finding, b.Finding)
            {
                case (OscillationFinding x, OscillationFinding y):
                    Assert.Equal(x.PeriodS, y.PeriodS, 0.11);
                    Assert.Equal(x.AmplitudePct, y.AmplitudePct, 0.011);
                    Assert.Equal(x.CauseHint, y.CauseHint);
                    Assert.Equal(x.Method, y.Method);
                    break;
                case (OffsetFinding x, OffsetFinding y):
                    Assert.Equal(x.OffsetPct, y.OffsetPct, 0.011);
                    Assert.Equal(x.Cause, y.Cause);
                    Assert.Equal(x.DurationS, y.DurationS);
                    break;
            }
        }
    }

    private static List<FindingChange> Feed(double scale, double offset)
    {
        var rig = new PidLoopRig(PidLoopRig.Pid("flow", min: offset, max: offset + 100 * scale, ti: 8, kc: 0.5));
        var trace = Trace.Value;
        for (var t = 0; t < trace.Length; t++)
            rig.Feed(t, offset + trace[t].Pv * scale, offset + trace[t].Sp * scale, trace[t].Op);
        return rig.Changes;
    }

    private static (double, double, double)[] Record()
    {
        var options = PidLoopRig.Options("flow", ti: 8, kc: 0.5);
        var trace = new List<(double, double, double)>();
        SimulatedLoop sticky = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = 0.5, TiSeconds = 8, TauSeconds = 5, DeadTimeSeconds = 1, StictionS = 4, StictionJ = 2, LoadSteps = [(60, 3)],
        });
        SimulatedLoop proportional = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = 2, TiSeconds = null, TauSeconds = 10, DeadTimeSeconds = 1, LoadSteps = [(300, 15)], NoiseSigmaPct = 0.2, Seed = 9,
        });
        for (var t = 0; t < 3600; t++) Add(sticky, t);
        for (var t = 0; t < 1800; t++) Add(proportional, t);
        return trace.ToArray();

        void Add(SimulatedLoop loop, int t)
        {
            loop.Step(t, 1);
            var r = loop.Reading;
            trace.Add((r.Pv, r.Sp, r.Op));
        }
    }
}

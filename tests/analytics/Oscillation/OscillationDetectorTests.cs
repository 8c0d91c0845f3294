using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Oscillation;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Tests.Oscillation;

public class OscillationDetectorTests
{
    private static double Gaussian(Random r) => Math.Sqrt(-2 * Math.Log(1 - r.NextDouble())) * Math.Cos(2 * Math.PI * r.NextDouble());

    /// <summary>Feeds PV = 50 - A sin(2 pi t / 60) (error A sin) with SP 50 and OP swinging against the PV.</summary>
    private static PidLoopRig Sinusoid(double amplitude, int seconds, double noise = 0, double? ti = null, string process = "other", int seed = 5)
    {
        var spec = PidLoopRig.Pid(process, ti: ti);
        var rig = new PidLoopRig(spec, new OscillationDetector(spec));
        var random = new Random(seed);
        for (var t = 0; t < seconds; t++)
        {
            var s = Math.Sin(2 * Math.PI * t / 60);
            rig.Feed(t, 50 - amplitude * s + noise * Gaussian(random), 50, 50 + 4 * amplitude * s);
        }
        return rig;
    }

    [Fact]
    public void Sinusoid1_2Pct_WithLimit1Pct_RaisesByHagglundsCount()
    {
        var rig = Sinusoid(1.2, 3600, ti: 60);

        var first = rig.Raised<OscillationFinding>().First();
        // Hagglund (1995): half-period IAE 2A/w above 2a/w_u (w_u = 2 pi / Ti) more than n_lim = 10 times, and
        // Thornhill's test (Thornhill et al. 2003) agrees the error is regular: both methods name it.
        Assert.Contains("iae-count", first.Method);
        Assert.Equal(60, first.PeriodS, 1.0);
        Assert.Equal("acf-regularity+iae-count", rig.Active<OscillationFinding>()!.Method);
    }

    [Fact]
    public void Sinusoid0_8Pct_WithLimit1Pct_RaisesNothing()
    {
        var rig = Sinusoid(0.8, 3600, ti: 60);

        // Hagglund (1995): 2A/w < 2a/w_u for A = 0.8 < a = 1; the ACF branch also needs the amplitude above a.
        Assert.Empty(rig.Changes);
    }

    [Fact]
    public void Sinusoid60sWithSmallNoise_PeriodWithin2Pct_RegularityAbove1()
    {
        var rig = Sinusoid(2.0, 3600, noise: 0.1);

        var finding = rig.Active<OscillationFinding>();
        Assert.NotNull(finding);
        // Thornhill, Huang & Zhang (2003): period from ACF zero crossings, regular when r > 1.
        Assert.Equal(60, finding.PeriodS, 60 * 0.02);
        Assert.True(finding.Regularity > 1, $"r = {finding.Regularity}");
        Assert.Contains("acf-regularity", finding.Method);
        // Amplitude as half peak-to-peak: 2 % plus a little noise.
        Assert.InRange(finding.AmplitudePct, 1.9, 2.5);
    }

    [Fact]
    public void WhiteNoise_RaisesNothing()
    {
        var spec = PidLoopRig.Pid("other");
        var detector = new OscillationDetector(spec);
        var rig = new PidLoopRig(spec, detector);
        var random = new Random(17);
        for (var t = 0; t < 3600; t++) rig.Feed(t, 50 + Gaussian(random), 50, 50);

        // Thornhill et al. (2003): white noise has no regular ACF (r < 1); our ACF-peak guard holds too.
        Assert.Empty(rig.Changes);
        Assert.True(!(detector.LastAcf.Regularity > 1) || detector.LastAcf.Peak < 0.3, $"{detector.LastAcf}");
    }

    [Fact]
    public void SquareOutputTrianglePv_ThroughTheMonitor_HintsStiction()
    {
        var spec = PidLoopRig.Pid("flow", ti: 20);
        var rig = new PidLoopRig(spec);
        for (var t = 0; t < 3600; t++)
        {
            // Valve jumps 45 <-> 55 %, PV ramps between 47 and 53 behind it: the shape a sticking valve gives.
            var phase = t % 60;
            var op = phase < 30 ? 55 : 45;
            var pv = phase < 30 ? 47 + 6.0 * phase / 30 : 53 - 6.0 * (phase - 30) / 30;
            rig.Feed(t, pv, 50, op);
        }

        var finding = rig.Active<OscillationFinding>();
        Assert.NotNull(finding);
        // Horch (1999): odd OP-PV cross-correlation means stiction.
        Assert.Equal(CauseHints.Stiction, finding.CauseHint);
        Assert.Contains("stiction", finding.Diagnosis);
        Assert.Contains("manual", finding.Diagnosis);
    }

    [Fact]
    public void SinusoidsInPhaseOpposition_ThroughTheMonitor_HintTuning()
    {
        var rig = Sinusoid(2.0, 3600, process: "flow", ti: 20);

        var finding = rig.Active<OscillationFinding>();
        Assert.NotNull(finding);
        // Horch (1999): even OP-PV cross-correlation means tuning or an outside disturbance.
        Assert.Equal(CauseHints.TuningOrDisturbance, finding.CauseHint);
        Assert.Contains("upstream", finding.Diagnosis);
    }

    [Fact]
    public void StickyValveInPiFlowLoop_RaisesOscillation_HintsStiction()
    {
        // A flow loop tuned as such loops commonly are, low gain and short integral time (common practice, no source).
        var options = PidLoopRig.Options("flow", ti: 8, kc: 0.5);
        var rig = new PidLoopRig(PidLoopRig.Check(options));
        var loop = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = 0.5, TiSeconds = 8, ProcessGain = 1, TauSeconds = 5, DeadTimeSeconds = 1,
            StictionS = 4, StictionJ = 2, LoadSteps = [(60, 3)],
        });

        rig.Run(loop, 3600);

        var finding = rig.Active<OscillationFinding>();
        Assert.NotNull(finding);
        // Choudhury, Thornhill & Shah (2005) model: S = 4, J = 2 give a stick-slip limit cycle; Horch (1999): odd CCF.
        Assert.Equal(CauseHints.Stiction, finding.CauseHint);
        Assert.True(finding.AmplitudePct >= 1, $"{finding}");
    }

    [Fact]
    public void PiLoopTunedAboveUltimateGain_RaisesOscillation_HintsTuning()
    {
        // Kp = 1, T = 60 s, L = 10 s has an ultimate gain of about 10 (phase crossover of first order plus dead time, textbook);
        // Kc = 11 grows until the output saturates, a relay-like cycle near the ultimate period of about 37 s.
        var options = PidLoopRig.Options("flow", ti: 120, kc: 11);
        var rig = new PidLoopRig(PidLoopRig.Check(options));
        var loop = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = 11, TiSeconds = 120, ProcessGain = 1, TauSeconds = 60, DeadTimeSeconds = 10, NoiseSigmaPct = 0.1, LoadSteps = [(60, 3)],
        });

        rig.Run(loop, 3600);

        var finding = rig.Active<OscillationFinding>();
        Assert.NotNull(finding);
        Assert.InRange(finding.PeriodS, 35, 45);
        // Horch (1999): too much gain gives an even OP-PV cross-correlation.
        Assert.Equal(CauseHints.TuningOrDisturbance, finding.CauseHint);
    }

    [Fact]
    public void LevelLoop_CauseHintIsUnknown()
    {
        var rig = Sinusoid(2.0, 7200, process: "level");

        var finding = rig.Active<OscillationFinding>();
        Assert.NotNull(finding);
        // Horch (1999) states the cross-correlation test for processes without integration (from memory): no hint for levels.
        Assert.Equal(CauseHints.Unknown, finding.CauseHint);
        Assert.Equal(60, finding.PeriodS, 60 * 0.02);
    }

    [Fact]
    public void HealthyPiLoopWithFilteredNoise_AnHour_RaisesNothing()
    {
        var options = PidLoopRig.Options("flow", ti: 30, kc: 1);
        var rig = new PidLoopRig(PidLoopRig.Check(options));
        var loop = new PidLoopModel(options, new PidLoopSetup
        {
            Kc = 1, TiSeconds = 30, ProcessGain = 1, TauSeconds = 10, DeadTimeSeconds = 2,
            NoiseSigmaPct = 0.5, NoiseFilterSeconds = 5, LoadAmplitudePct = 10, LoadMeanGapSeconds = 600, LoadMeanHoldSeconds = 300, Seed = 21,
        });

        rig.Run(loop, 3600);

        // A PI loop with gain margin well above 2 (Kc Kp = 1, L/T = 0.2) does not oscillate: common practice, no source.
        Assert.DoesNotContain(rig.Changes, c => c.Finding.Kind == FindingKinds.Oscillation);
        Assert.DoesNotContain(rig.Changes, c => c.Finding.Kind == FindingKinds.SustainedOffset);
    }

    [Fact]
    public void OscillationThatStops_EndsAfterSomePeriods()
    {
        var spec = PidLoopRig.Pid("other");
        var rig = new PidLoopRig(spec);
        var random = new Random(8);
        for (var t = 0; t < 5400; t++)
        {
            var s = t < 2400 ? 2 * Math.Sin(2 * Math.PI * t / 60) : 0;
            rig.Feed(t, 50 - s + 0.1 * Gaussian(random), 50, 50 + s);
        }

        var ended = rig.Changes.Where(c => c.Change == FindingChangeKind.Ended).Select(c => c.Finding).OfType<OscillationFinding>().Single();
        var stop = new DateTimeOffset(PidLoopRig.T0, TimeSpan.Zero).AddSeconds(2400);
        // Our hysteresis: ended once neither method has seen it for 10 periods (and two ACF evaluations).
        Assert.InRange(ended.End!.Value, stop, stop.AddSeconds(1200));
        Assert.Null(rig.Active<OscillationFinding>());
    }

    [Fact]
    public void LoopTakenToManual_EndsTheFinding()
    {
        var spec = PidLoopRig.Pid("other", mode: true);
        var rig = new PidLoopRig(spec);
        for (var t = 0; t < 2400; t++)
        {
            var s = 2 * Math.Sin(2 * Math.PI * t / 60);
            rig.Feed(t, 50 - s, 50, 50 + s, t < 1800 ? LoopMode.Auto : LoopMode.Manual);
        }

        // The finding is about the controller acting: in manual it no longer applies (our rule).
        Assert.Single(rig.Raised<OscillationFinding>());
        Assert.Null(rig.Active<OscillationFinding>());
    }

    [Fact]
    public void Statistics_OfASinusoidalError_GiveMeanZeroAndStdAOverRoot2()
    {
        var rig = Sinusoid(2.0, 1200);

        var stats = rig.Monitor.Statistics();

        // Standard deviation of A sin over whole periods is A / sqrt(2) (calculus fact); the window holds 1020 s = 17 periods.
        Assert.Equal(0, stats.MeanErrorPct!.Value, 0.01);
        Assert.Equal(2.0 / Math.Sqrt(2), stats.ErrorStdPct!.Value, 0.01);
    }
}

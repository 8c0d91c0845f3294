using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.ProportionalBand;
using LoopWatch.Analytics.Tests.Oscillation;

namespace LoopWatch.Analytics.Tests.ProportionalBand;

public sealed class ProportionalBandAdviserTests
{
    private const double Kp = 1.5, Tau = 30, DeadTime = 4, Load = -6;

    private static PidLoopModel Loop(double kc, bool setPointTest = true) => new(PidLoopRig.Options(process: "pressure"), new PidLoopSetup
    {
        Kc = kc, TiSeconds = null, ProcessGain = Kp, TauSeconds = Tau, DeadTimeSeconds = DeadTime, SetPointPct = 50,
        NoiseSigmaPct = 0.05, NoiseFilterSeconds = 3, Seed = 21,
        SetPointSteps = setPointTest ? [(600, 47), (1200, 50)] : null,
        LoadSteps = [(1800, Load)],
    });

    private static ProportionalBandAdvice? Run(double kc, bool setPointTest = true, bool tuningKnown = true, double seconds = 3000)
    {
        var options = PidLoopRig.Options(process: "pressure");
        options.Tuning = tuningKnown ? new TuningOptions { Kc = kc, DeadTimeSeconds = DeadTime, TimeConstantSeconds = Tau } : null;
        var rig = new PidLoopRig(PidLoopRig.Check(options));
        rig.Run(Loop(kc, setPointTest), (long)seconds);
        return rig.Monitor.Statistics().Advice?.OffsetWhatIf;
    }

    /// <summary>Seborg, Edgar and Mellichamp (Process Dynamics and Control), proportional control of a first-order process: offset = K_L M / (1 + Kc Kp); here the load enters at the process input, so K_L = Kp.</summary>
    private static double SeborgOffset(double kc) => -Kp * Load / (1 + kc * Kp);

    [Fact]
    public void The_process_gain_and_the_offset_of_every_band_follow_the_textbook_formula()
    {
        const double kc = 1.2;
        var a = Run(kc)!;
        Assert.True(a.Shown, a.NotShownBecause);
        Assert.InRange(a.ProcessGain, 0.97 * Kp, 1.03 * Kp);
        Assert.Equal(SeborgOffset(kc), a.OffsetPct, 0.1);
        Assert.Equal(5, a.Rows!.Count);
        foreach (var row in a.Rows)
        {
            Assert.Equal(100 / row.PbPct, row.Kc, row.Kc * 1e-3); // PB % = 100 / Kc (trade definition)
            Assert.InRange(row.OffsetPct, 0.97 * SeborgOffset(row.Kc), 1.03 * SeborgOffset(row.Kc));
            Assert.Equal(a.LoadEffectPct / (1 + row.Kc * a.ProcessGain), row.OffsetPct, row.OffsetPct * 1e-3);
        }
        Assert.Single(a.Rows, r => r.Current);
        Assert.Contains(a.Explanation, l => l.Contains("Only integral action removes the offset"));
    }

    [Fact]
    public void A_band_from_the_table_run_on_the_simulated_loop_leaves_the_offset_it_predicted()
    {
        var a = Run(1.2)!;
        var narrower = a.Rows!.First(r => r.PbPct < a.PbPct && !r.Oscillates);
        var other = Run(narrower.Kc)!;
        // The same loop and load with the other band in the controller: the offset it really leaves.
        Assert.InRange(other.OffsetPct, 0.97 * narrower.OffsetPct, 1.03 * narrower.OffsetPct);
    }

    [Fact]
    public void A_load_change_alone_does_not_measure_the_process_gain()
    {
        var a = Run(1.2, setPointTest: false)!;
        Assert.False(a.Shown);
        Assert.Contains("set-point change", a.NotShownBecause);
    }

    [Fact]
    public void A_loop_without_known_tuning_or_offset_gets_no_what_if()
    {
        Assert.Null(Run(1.2, tuningKnown: false, seconds: 1500));
    }

    [Fact]
    public void The_ultimate_gain_marks_the_bands_that_would_oscillate()
    {
        var a = Run(1.2)!;
        var (ku, _) = UltimateGain.Of(a.ProcessGain, Tau, DeadTime);
        Assert.Equal(ku, a.UltimateKc!.Value, ku * 1e-3);
        foreach (var row in a.Rows!) Assert.Equal(row.Kc >= a.UltimateKc, row.Oscillates);
    }
}

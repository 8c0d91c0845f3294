using LoopWatch.Agent.Plant;
using LoopWatch.Analytics.Performance;
using LoopWatch.Analytics.Tests.Oscillation;
using MathNet.Numerics.LinearRegression;

namespace LoopWatch.Analytics.Tests.Performance;

public sealed class HarrisIndexTests
{
    private static double[] Ar1(double phi, int n, int seed)
    {
        var noise = new MeasurementNoise(1, 0, 1, seed);
        var y = new double[n];
        var state = 0.0;
        for (var i = -500; i < n; i++)
        {
            state = phi * state + noise.Next();
            if (i >= 0) y[i] = state;
        }
        return y;
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(0.8)]
    [InlineData(0.9)]
    public void An_AR1_disturbance_with_b_3_gives_the_analytic_index(double phi)
    {
        var y = Ar1(phi, 20_000, 11);
        var harris = new HarrisIndex(y.Length, 15, 3);
        y.CopyTo(harris.Input);
        var f = harris.Compute(y.Length)!.Value;
        // Harris (1989): y_t = phi y_(t-1) + a_t has psi_j = phi^j, so sigma_mv^2 = sigma_a^2 (1 + phi^2 + phi^4) for b = 3
        // and sigma_y^2 = sigma_a^2 / (1 - phi^2): index = 1 - (1 + phi^2 + phi^4)(1 - phi^2).
        var expected = 1 - (1 + phi * phi + Math.Pow(phi, 4)) * (1 - phi * phi);
        Assert.Equal(expected, f.Index, 0.02);
        Assert.Equal(1.0, f.InnovationVariance, 0.03);
        Assert.Equal(phi, harris.Coefficients[0], 0.02);
        Assert.Equal(phi * phi, harris.Impulse[2], 0.03);
    }

    [Fact]
    public void The_AR_fit_matches_MathNet_least_squares()
    {
        var y = Ar1(0.7, 3000, 12);
        const int p = 10;
        var harris = new HarrisIndex(y.Length, p, 2);
        y.CopyTo(harris.Input);
        Assert.NotNull(harris.Compute(y.Length));
        // Reference: MathNet.Numerics QR least squares on the same mean-removed lagged design matrix.
        var mean = y.Average();
        var c = y.Select(v => v - mean).ToArray();
        var rows = Enumerable.Range(p, c.Length - p).Select(t => Enumerable.Range(0, p).Select(i => c[t - 1 - i]).ToArray()).ToArray();
        var target = Enumerable.Range(p, c.Length - p).Select(t => c[t]).ToArray();
        var reference = MultipleRegression.QR(rows, target);
        for (var i = 0; i < p; i++) Assert.Equal(reference[i], harris.Coefficients[i], 1e-9);
    }

    [Fact]
    public void Without_a_dead_time_the_adviser_says_why_there_is_no_index()
    {
        var rig = new PidLoopRig(PidLoopRig.Pid(ti: 20, kc: 1));
        for (var s = 0; s < 120; s++) rig.Feed(s, 50, 50, 50);
        var a = rig.Monitor.Statistics().Advice!.Value.Performance!;
        Assert.False(a.Shown);
        Assert.Contains("Tuning:DeadTimeSeconds", a.NotShownBecause);
    }

    [Fact]
    public void The_adviser_refits_a_routine_window_and_its_figures_redo_by_hand()
    {
        var options = PidLoopRig.Options(ti: 20, kc: 1);
        options.Tuning!.DeadTimeSeconds = 3;
        var rig = new PidLoopRig(PidLoopRig.Check(options));
        var y = Ar1(0.8, 2400, 13);
        // The error SP - PV is the AR(1) series, % of a 0-100 span.
        for (var s = 0; s < y.Length; s++) rig.Feed(s, 50 - y[s], 50, 50);
        var a = rig.Monitor.Statistics().Advice!.Value.Performance!;
        Assert.True(a.Shown, a.NotShownBecause);
        Assert.Equal(3, a.DelaySamples);
        Assert.Equal(1800, a.WindowSamples);
        var expected = 1 - (1 + 0.64 + 0.4096) * (1 - 0.64); // AR(1) analytic index as above
        Assert.Equal(expected, a.Index, 0.06);
        var sum = a.Impulse!.Sum(p => p * p);
        Assert.Equal(a.InnovationStdPct * Math.Sqrt(sum), a.MinimumStdPct, a.MinimumStdPct * 1e-3);
        Assert.Equal(1 - a.MinimumStdPct * a.MinimumStdPct / (a.ErrorStdPct * a.ErrorStdPct), a.Index, 1e-3);
    }
}

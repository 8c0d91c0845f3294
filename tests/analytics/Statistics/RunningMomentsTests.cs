using LoopWatch.Analytics.Statistics;
using MathNet.Numerics.Statistics;

namespace LoopWatch.Analytics.Tests.Statistics;

public sealed class RunningMomentsTests
{
    private static double[] Data(int n, int seed, double offset)
    {
        var r = new Random(seed);
        var xs = new double[n];
        for (var i = 0; i < n; i++) xs[i] = offset + 3.7 * (r.NextDouble() - 0.5) + (i % 17) * 0.01;
        return xs;
    }

    private static void Close(double expected, double actual) =>
        Assert.True(Math.Abs(actual - expected) <= 1e-9 * Math.Abs(expected), $"expected {expected:R}, got {actual:R}");

    [Theory]
    [InlineData(2, 1, 0.0)]
    [InlineData(1000, 2, 0.0)]
    [InlineData(5000, 3, 1e4)]
    public void Add_SeededData_MatchesMathNetMeanAndSampleVariance(int n, int seed, double offset)
    {
        var xs = Data(n, seed, offset);
        var m = new RunningMoments();
        foreach (var x in xs) m.Add(x);
        var v = m.Value;
        Assert.Equal(n, v.Count);
        // Reference library: MathNet.Numerics Statistics.Mean / Variance (n - 1) / StandardDeviation.
        Close(xs.Mean(), v.Mean);
        Close(xs.Variance(), v.Variance);
        Close(xs.StandardDeviation(), v.StdDev);
    }

    [Fact]
    public void AddMoments_TwoHalves_MatchesMathNetOnTheWhole()
    {
        var xs = Data(3001, 4, 50);
        var a = new RunningMoments();
        var b = new RunningMoments();
        for (var i = 0; i < xs.Length; i++) (i < 1200 ? a : b).Add(xs[i]);
        a.Add(b.Value);
        // MathNet.Numerics on the whole series.
        Close(xs.Mean(), a.Value.Mean);
        Close(xs.Variance(), a.Value.Variance);
    }

    [Fact]
    public void Windowed_AfterManyValues_MatchesMathNetOnTheLastWindow()
    {
        var xs = Data(10_007, 5, 20);
        var w = new WindowedMoments(300);
        foreach (var x in xs) w.Add(x);
        var last = xs[^300..];
        // MathNet.Numerics on the last 300 values.
        Close(last.Mean(), w.Value.Mean);
        Close(last.Variance(), w.Value.Variance);
        Assert.Equal(300, w.Value.Count);
    }

    [Fact]
    public void Remove_BackToOneValue_LeavesThatValue()
    {
        var m = new RunningMoments();
        m.Add(4);
        m.Add(10);
        m.Remove(4);
        Assert.Equal(1, m.Count);
        Assert.Equal(10, m.Value.Mean, 12);
        Assert.True(double.IsNaN(m.Value.Variance));
    }
}

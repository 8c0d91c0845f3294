using LoopWatch.Analytics.Windows;
using MathNet.Numerics.Statistics;

namespace LoopWatch.Analytics.Tests.Windows;

public class LagCorrelationTests
{
    [Theory]
    [InlineData(1, 1024, 512)]
    [InlineData(7, 1000, 300)]
    [InlineData(42, 257, 256)]
    public void Auto_SeededRandomData_MatchesMathNet(int seed, int n, int lags)
    {
        var random = new Random(seed);
        var x = new double[n];
        // A random walk plus offset: autocorrelated, with a mean far from zero, as a control error can be.
        for (var i = 0; i < n; i++) x[i] = (i == 0 ? 5 : x[i - 1]) + random.NextDouble() - 0.5;

        var expected = Correlation.Auto(x, lags - 1, 0);
        var centered = (double[])x.Clone();
        LagCorrelation.Center(centered.AsSpan());
        var actual = new double[lags];
        LagCorrelation.Auto<double>(centered, actual);

        Assert.Equal(expected.Length, actual.Length);
        for (var k = 0; k < lags; k++)
        {
            // Reference: MathNet.Numerics 5 Correlation.Auto (FFT-based, mean removed, normalised by lag 0).
            Assert.True(Math.Abs(actual[k] - expected[k]) <= 1e-9 * Math.Max(1e-3, Math.Abs(expected[k])),
                $"lag {k}: {actual[k]} vs MathNet {expected[k]}");
        }
    }

    [Fact]
    public void Cross_ShiftedCopy_PeaksAtTheShift()
    {
        var random = new Random(3);
        var u = new float[600];
        for (var i = 0; i < u.Length; i++) u[i] = (float)(random.NextDouble() - 0.5);
        var y = new float[600];
        for (var i = 7; i < y.Length; i++) y[i] = u[i - 7];
        LagCorrelation.Center<float>(u);
        LagCorrelation.Center<float>(y);

        var best = Enumerable.Range(-20, 41).MaxBy(k => LagCorrelation.Cross<float>(u, y, k));

        // Definition of the cross-correlation sum u_t y_(t+k): y delayed by 7 samples peaks at k = +7 (textbook fact).
        Assert.Equal(7, best);
    }

    [Fact]
    public void RingBuffer_Wrapped_CopiesOldestFirst()
    {
        var ring = new RingBuffer(4);
        for (var i = 1; i <= 6; i++) ring.Add(i);
        var copy = new float[4];

        Assert.Equal(4, ring.CopyTo(copy));
        // A ring of 4 after 1..6 holds 3..6 (definition of a ring buffer).
        Assert.Equal(new float[] { 3, 4, 5, 6 }, copy);
        Assert.Equal(6, ring[0]);
        Assert.Equal(1.5, ring.HalfRange(4));
    }
}

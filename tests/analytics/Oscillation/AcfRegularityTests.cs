using LoopWatch.Analytics.Oscillation;
using LoopWatch.Analytics.Windows;

namespace LoopWatch.Analytics.Tests.Oscillation;

public class AcfRegularityTests
{
    private static float[] Window(Func<int, double> f, int n = 1024)
    {
        var x = new float[n];
        for (var i = 0; i < n; i++) x[i] = (float)f(i);
        LagCorrelation.Center<float>(x);
        return x;
    }

    private static double Gaussian(Random r) => Math.Sqrt(-2 * Math.Log(1 - r.NextDouble())) * Math.Cos(2 * Math.PI * r.NextDouble());

    [Fact]
    public void SinusoidOf60sWithSmallNoise_IsRegular_AndPeriodWithin2Pct()
    {
        var random = new Random(11);
        var x = Window(i => 2.0 * Math.Sin(2 * Math.PI * i / 60) + 0.1 * Gaussian(random));

        var acf = AcfRegularity.Measure(x, 512, new double[11]);

        // Thornhill, Huang & Zhang (2003): the ACF of a periodic signal crosses zero every half period; r > 1 is regular.
        Assert.Equal(60, acf.PeriodSamples, 60 * 0.02);
        Assert.True(acf.Regularity > 1, $"r = {acf.Regularity}");
        Assert.Equal(11, acf.ZeroCrossings);
        // The ACF of a sinusoid is cos(w k) times the taper (N - k)/N of the biased estimator: about 0.94 at k = 60.
        Assert.True(acf.Peak > 0.85, $"peak {acf.Peak}");
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void WhiteNoise_IsNotRegular(int seed)
    {
        var random = new Random(seed);
        var x = Window(_ => Gaussian(random));

        var acf = AcfRegularity.Measure(x, 512, new double[11]);

        // Thornhill et al. (2003): noise gives irregular ACF zero crossings, r < 1; its ACF at any lag > 0 is about 1/sqrt(N).
        Assert.True(acf.Regularity < 1, $"r = {acf.Regularity}");
        Assert.True(acf.Peak < 0.3, $"peak {acf.Peak}");
    }
}

namespace LoopWatch.Agent.Plant;

/// <summary>Seeded Gaussian measurement noise, optionally passed through a first-order filter to make it autocorrelated.</summary>
public sealed class MeasurementNoise
{
    private readonly Random _random;
    private readonly double _sigma, _alpha;
    private double _state;

    /// <summary>Noise of standard deviation <paramref name="sigma"/> (after filtering) with filter time constant <paramref name="filterTau"/> s (0 = white).</summary>
    public MeasurementNoise(double sigma, double filterTau, double dt, int seed)
    {
        _random = new Random(seed);
        _alpha = filterTau > 0 ? Math.Exp(-dt / filterTau) : 0;
        // y = a y + w has var(y) = var(w) / (1 - a^2): scale the white input so the filtered output has the asked sigma.
        _sigma = sigma * Math.Sqrt(1 - _alpha * _alpha);
    }

    /// <summary>The next noise value.</summary>
    public double Next()
    {
        _state = _alpha * _state + _sigma * Gaussian();
        return _state;
    }

    /// <summary>A standard normal draw (Box-Muller).</summary>
    public double Gaussian()
    {
        var u1 = 1.0 - _random.NextDouble();
        var u2 = _random.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}

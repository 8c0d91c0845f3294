namespace LoopWatch.Agent.Plant;

/// <summary>Load disturbances that come and go: steps of random size at random times, each held for a while, from a seed.</summary>
public sealed class LoadSchedule
{
    private readonly Random _random;
    private readonly double _meanGapS, _meanHoldS, _amplitude;
    private double _untilChange;
    private bool _active;

    /// <summary>Steps of up to ±<paramref name="amplitude"/>, on average every <paramref name="meanGapS"/> s, each lasting about <paramref name="meanHoldS"/> s.</summary>
    public LoadSchedule(double amplitude, double meanGapS, double meanHoldS, int seed)
    {
        _random = new Random(seed);
        _amplitude = amplitude;
        _meanGapS = meanGapS;
        _meanHoldS = meanHoldS;
        _untilChange = Exponential(meanGapS);
    }

    /// <summary>The disturbance now.</summary>
    public double Value { get; private set; }

    /// <summary>Advances <paramref name="dt"/> s and returns the disturbance.</summary>
    public double Step(double dt)
    {
        _untilChange -= dt;
        if (_untilChange > 0) return Value;
        _active = !_active;
        Value = _active ? _amplitude * (2 * _random.NextDouble() - 1) : 0;
        _untilChange = Exponential(_active ? _meanHoldS : _meanGapS);
        return Value;
    }

    private double Exponential(double mean) => -mean * Math.Log(1.0 - _random.NextDouble());
}

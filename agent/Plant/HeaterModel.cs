using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Plant;

/// <summary>
/// A tank heated by an on-off element: first-order heating toward ambient + rise when on, cooling toward ambient when off,
/// with a thermostat between two switching temperatures. Temperatures in deg C.
/// </summary>
public sealed class HeaterModel : SimulatedLoop
{
    private readonly FirstOrderDeadTime _tank;
    private readonly OnOffController _thermostat;
    private readonly double _ambient;
    private readonly MeasurementNoise? _noise;
    private double _measured;

    /// <summary>A heater of full-power rise <paramref name="rise"/> K over ambient, time constant <paramref name="tau"/> s.</summary>
    public HeaterModel(LoopOptions options, double ambient, double rise, double tau, double deadTime, double low, double high, double noiseSigma = 0, int seed = 1)
        : base(options)
    {
        _ambient = ambient;
        _tank = new FirstOrderDeadTime(rise, tau, deadTime, 1, (low + high) / 2 - ambient, 0);
        _thermostat = new OnOffController(low, high, directActing: false);
        if (noiseSigma > 0) _noise = new MeasurementNoise(noiseSigma, 0, 1, seed);
        _measured = (low + high) / 2;
        SetPoint = (low + high) / 2;
    }

    /// <summary>Mid-point of the switching temperatures, published as the set point.</summary>
    public double SetPoint { get; }

    /// <inheritdoc />
    public override PlantReading Reading => new(_measured, SetPoint, _thermostat.On ? 100 : 0, double.NaN, LoopMode.Auto);

    /// <inheritdoc />
    public override void Step(double t, double dt)
    {
        var on = _thermostat.Step(_measured);
        _measured = _ambient + _tank.Step(on ? 1 : 0) + (_noise?.Next() ?? 0);
    }
}

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Plant;

/// <summary>
/// A wet well emptied by one on-off pump: dV/dt = Qin - Qp when running, Qin when stopped; the pump starts at the
/// high switching level and stops at the low one. Level in metres, flows in m3/s.
/// </summary>
public sealed class SumpModel : SimulatedLoop
{
    private readonly IntegratingTank _well;
    private readonly OnOffController _switch;
    private readonly double _pumpRate, _baseInflow;
    private readonly LoadSchedule? _inflowSwings;
    private readonly MeasurementNoise? _noise;
    private double _measured;

    /// <summary>A sump of <paramref name="area"/> m2 switching between <paramref name="stopLevel"/> and <paramref name="startLevel"/> m.</summary>
    public SumpModel(LoopOptions options, double area, double depth, double stopLevel, double startLevel, double pumpRate, double inflow,
        double inflowSwing = 0, double noiseSigma = 0, int seed = 1) : base(options)
    {
        _well = new IntegratingTank(area, depth, (stopLevel + startLevel) / 2);
        _switch = new OnOffController(stopLevel, startLevel, directActing: true);
        _pumpRate = pumpRate;
        _baseInflow = inflow;
        if (inflowSwing > 0) _inflowSwings = new LoadSchedule(inflowSwing, 900, 600, seed);
        if (noiseSigma > 0) _noise = new MeasurementNoise(noiseSigma, 0, 1, seed + 7);
        _measured = _well.Level;
    }

    /// <summary>Starts of the pump so far.</summary>
    public long Starts => _switch.Starts;

    /// <inheritdoc />
    public override PlantReading Reading => new(_measured, double.NaN, _switch.On ? 100 : 0, double.NaN, LoopMode.Auto);

    /// <inheritdoc />
    public override void Step(double t, double dt)
    {
        var on = _switch.Step(_measured);
        var inflow = Math.Max(0, _baseInflow + (_inflowSwings?.Step(dt) ?? 0));
        _well.Step(inflow, on ? _pumpRate : 0, dt);
        _measured = _well.Level + (_noise?.Next() ?? 0);
    }
}

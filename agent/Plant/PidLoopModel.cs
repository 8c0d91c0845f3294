using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Plant;

/// <summary>
/// A continuous loop: PI or P-only controller, optional sticky valve, a first-order-plus-dead-time or an integrating
/// process, load disturbances entering at the process input, noise on the measurement, and periods in manual.
/// All controller arithmetic is in % of PV span.
/// </summary>
public sealed class PidLoopModel : SimulatedLoop
{
    private readonly PiController _controller;
    private readonly FirstOrderDeadTime? _process;
    private readonly IntegratingTank? _tank;
    private readonly double _tankOutflowPct;
    private readonly StictionValve? _valve;
    private readonly MeasurementNoise? _noise, _inputNoise;
    private readonly LoadSchedule? _loads;
    private readonly (double Start, double End)[] _manual;
    private readonly (double At, double LoadPct)[] _loadSteps;
    private readonly (double At, double SetPointPct)[] _spSteps;
    private readonly double _min, _span;
    private double _truePct, _measuredPct, _spPct, _op, _position;
    private LoopMode _mode = LoopMode.Auto;

    /// <summary>Builds the loop; see <see cref="PidLoopSetup"/> for what each setting means.</summary>
    public PidLoopModel(LoopOptions options, PidLoopSetup setup) : base(options)
    {
        _min = options.Pv!.Min!.Value;
        _span = options.Pv.Max!.Value - _min;
        _spPct = setup.SetPointPct;
        _truePct = _measuredPct = setup.SetPointPct;
        _op = _position = setup.InitialOpPct;
        _controller = new PiController(setup.Kc, setup.TiSeconds, setup.InitialOpPct);
        if (setup.IntegratingAreaPctPerPctS is { } rate)
        {
            _tank = new IntegratingTank(1.0 / rate, 100, setup.SetPointPct);
            _tankOutflowPct = setup.InitialOpPct;
        }
        else
        {
            _process = new FirstOrderDeadTime(setup.ProcessGain, setup.TauSeconds, setup.DeadTimeSeconds, setup.Dt,
                setup.SetPointPct, setup.SetPointPct / setup.ProcessGain);
            _controller.Bias = setup.SetPointPct / setup.ProcessGain;
            _op = _position = _controller.Bias;
        }
        if (setup.StictionS is { } s) _valve = new StictionValve(s, setup.StictionJ, _op);
        if (setup.NoiseSigmaPct > 0) _noise = new MeasurementNoise(setup.NoiseSigmaPct, setup.NoiseFilterSeconds, setup.Dt, setup.Seed);
        if (setup.InputNoiseSigmaPct > 0) _inputNoise = new MeasurementNoise(setup.InputNoiseSigmaPct, setup.InputNoiseFilterSeconds, setup.Dt, setup.Seed + 2);
        if (setup.LoadAmplitudePct > 0) _loads = new LoadSchedule(setup.LoadAmplitudePct, setup.LoadMeanGapSeconds, setup.LoadMeanHoldSeconds, setup.Seed + 1);
        _manual = setup.ManualPeriods ?? [];
        _loadSteps = setup.LoadSteps ?? [];
        _spSteps = setup.SetPointSteps ?? [];
    }

    /// <inheritdoc />
    public override PlantReading Reading => new(_min + _measuredPct * _span / 100, _min + _spPct * _span / 100, _op, _position, _mode);

    /// <summary>The process value without measurement noise, % of span.</summary>
    public double TruePvPct => _truePct;

    /// <inheritdoc />
    public override void Step(double t, double dt)
    {
        var load = (_loads?.Step(dt) ?? 0) + StepLoad(t) + (_inputNoise?.Next() ?? 0);
        foreach (var (at, pct) in _spSteps) if (t >= at) _spPct = pct;
        var manual = InManual(t);
        if (manual)
        {
            // In manual the output is held where the operator left it.
            _mode = LoopMode.Manual;
            _controller.Track(_spPct, _measuredPct, _op);
        }
        else
        {
            _mode = LoopMode.Auto;
            _op = _controller.Step(_spPct, _measuredPct, dt);
        }
        _position = _valve?.Step(_op) ?? _op;
        var input = _position + load;
        _truePct = _tank is not null ? _tank.Step(input, _tankOutflowPct, dt) : _process!.Step(input);
        _measuredPct = _truePct + (_noise?.Next() ?? 0);
    }

    private double StepLoad(double t)
    {
        var load = 0.0;
        foreach (var (at, pct) in _loadSteps) if (t >= at) load = pct;
        return load;
    }

    private bool InManual(double t)
    {
        foreach (var (start, end) in _manual) if (t >= start && t < end) return true;
        return false;
    }
}

using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Plant;

/// <summary>
/// Quillmoor Works, a fictional water and steam utility plant: nine loops with faults placed on purpose
/// (a proportional-only offset, a short-cycling sump, a sticky valve, an aggressive tuning, a noisy measurement that
/// makes a valve hunt, a loop left in manual) beside healthy ones. Topics are <c>quillmoor/&lt;loop&gt;/&lt;pv|sp|op|mode|zt&gt;</c>.
/// </summary>
public sealed class DemoPlant
{
    /// <summary>Topic prefix of every demo tag.</summary>
    public const string TopicRoot = "quillmoor";

    private readonly List<SimulatedLoop> _loops;

    /// <summary>Builds the plant; the same seed gives the same run.</summary>
    public DemoPlant(int seed = 42)
    {
        _loops =
        [
            Pid("FIC-101", "Raw water intake flow", "Intake", "flow", 0, 250, "m3/h", false, new PidLoopSetup
            {
                Kc = 0.5, TiSeconds = 10, TauSeconds = 8, DeadTimeSeconds = 2, SetPointPct = 60,
                NoiseSigmaPct = 0.2, NoiseFilterSeconds = 5, LoadAmplitudePct = 5, Seed = seed,
            }),
            Pid("PIC-201", "Clean-water header pressure (proportional-only)", "Distribution", "pressure", 0, 10, "bar", false, new PidLoopSetup
            {
                Kc = 2, TiSeconds = null, TauSeconds = 20, DeadTimeSeconds = 3, SetPointPct = 55,
                NoiseSigmaPct = 0.03, NoiseFilterSeconds = 3, LoadSteps = [(900, -9)], Seed = seed + 10,
                // A set-point test (down 2 % of span and back) before the load change: it shows the process gain.
                SetPointSteps = [(300, 53), (660, 55)],
            }, new TuningOptions { PbPct = 50, DeadTimeSeconds = 3, TimeConstantSeconds = 20 }),
            new SumpModel(OnOff("LIC-301", "Effluent sump level", "Effluent", "level", 0, 3, "m", withSp: false), area: 3, depth: 3,
                stopLevel: 1.0, startLevel: 1.4, pumpRate: 0.04, inflow: 0.02, inflowSwing: 0.004, noiseSigma: 0.003, seed: seed + 20),
            new HeaterModel(OnOff("TIC-401", "Hot-water tank heater", "Utilities", "temperature", 0, 100, "degC", withSp: true),
                ambient: 15, rise: 60, tau: 1800, deadTime: 20, low: 58, high: 62, noiseSigma: 0.05, seed: seed + 30),
            Pid("FIC-102", "Filter backwash flow (sticky valve)", "Filtration", "flow", 0, 400, "m3/h", true, new PidLoopSetup
            {
                Kc = 0.5, TiSeconds = 8, TauSeconds = 5, DeadTimeSeconds = 1, SetPointPct = 45,
                StictionS = 6, StictionJ = 3, NoiseSigmaPct = 0.05, LoadSteps = [(60, 3)], LoadAmplitudePct = 3, LoadMeanGapSeconds = 900, LoadMeanHoldSeconds = 900, Seed = seed + 40,
            }),
            Pid("TIC-202", "Boiler feedwater preheater outlet temperature", "Boiler house", "temperature", 0, 200, "degC", false, new PidLoopSetup
            {
                Kc = 5.3, TiSeconds = 40, TauSeconds = 60, DeadTimeSeconds = 15, SetPointPct = 50,
                InputNoiseSigmaPct = 2.5, InputNoiseFilterSeconds = 50, NoiseSigmaPct = 0.05, Seed = seed + 50,
            }, new TuningOptions { Kc = 5.3, TiSeconds = 40, DeadTimeSeconds = 15 }),
            Pid("PIC-103", "Steam header pressure", "Boiler house", "pressure", 0, 16, "bar", false, new PidLoopSetup
            {
                Kc = 3, TiSeconds = 10, TauSeconds = 10, DeadTimeSeconds = 1, SetPointPct = 62.5,
                NoiseSigmaPct = 0.5, Seed = seed + 60,
            }),
            Pid("FIC-104", "Coagulant dosing flow", "Filtration", "flow", 0, 50, "L/h", false, new PidLoopSetup
            {
                Kc = 0.6, TiSeconds = 8, TauSeconds = 5, DeadTimeSeconds = 1, SetPointPct = 40,
                NoiseSigmaPct = 0.2, NoiseFilterSeconds = 3, LoadAmplitudePct = 6, Seed = seed + 70,
                ManualPeriods = ManualEvery(hours: 4, firstAtS: 1800, lengthS: 2400, days: 8),
            }, withMode: true),
            Pid("LIC-105", "Clear-water tank level", "Distribution", "level", 0, 5, "m", false, new PidLoopSetup
            {
                Kc = 3, TiSeconds = 600, IntegratingAreaPctPerPctS = 0.004, SetPointPct = 60, InitialOpPct = 50,
                NoiseSigmaPct = 0.03, NoiseFilterSeconds = 5, LoadAmplitudePct = 8, LoadMeanGapSeconds = 1200, Seed = seed + 80,
            }),
        ];
    }

    /// <summary>The loops of the plant.</summary>
    public IReadOnlyList<SimulatedLoop> Loops => _loops;

    /// <summary>Seconds of simulated time since the plant started.</summary>
    public double Time { get; private set; }

    /// <summary>The loops as the agent's configuration would list them.</summary>
    public IReadOnlyList<LoopOptions> Configuration => _loops.Select(l => l.Options).ToList();

    /// <summary>Advances every loop by <paramref name="dt"/> simulated seconds.</summary>
    public void Step(double dt = 1)
    {
        foreach (var loop in _loops) loop.Step(Time, dt);
        Time += dt;
    }

    /// <summary>The MQTT topic of one of a demo loop's signals.</summary>
    public static string Topic(string loopId, string signal) => $"{TopicRoot}/{loopId}/{signal}";

    private static PidLoopModel Pid(string id, string description, string area, string process, double min, double max, string unit,
        bool withPosition, PidLoopSetup setup, TuningOptions? tuning = null, bool withMode = false)
    {
        var options = new LoopOptions
        {
            Id = id, Description = description, Area = area, Kind = "pid", Process = process,
            Pv = new SignalOptions { Tag = Topic(id, "pv"), Min = min, Max = max, Unit = unit },
            Sp = new SignalOptions { Tag = Topic(id, "sp") },
            Op = new SignalOptions { Tag = Topic(id, "op") },
            Mode = withMode ? new SignalOptions { Tag = Topic(id, "mode") } : null,
            Position = withPosition ? new SignalOptions { Tag = Topic(id, "zt") } : null,
            Tuning = tuning ?? new TuningOptions { Kc = setup.Kc, TiSeconds = setup.TiSeconds },
        };
        return new PidLoopModel(options, setup);
    }

    private static LoopOptions OnOff(string id, string description, string area, string process, double min, double max, string unit, bool withSp) => new()
    {
        Id = id, Description = description, Area = area, Kind = "on-off", Process = process,
        Pv = new SignalOptions { Tag = Topic(id, "pv"), Min = min, Max = max, Unit = unit },
        Sp = withSp ? new SignalOptions { Tag = Topic(id, "sp") } : null,
        Op = new SignalOptions { Tag = Topic(id, "op") },
    };

    private static (double, double)[] ManualEvery(double hours, double firstAtS, double lengthS, int days)
    {
        var list = new List<(double, double)>();
        for (var t = firstAtS; t < days * 86400.0; t += hours * 3600) list.Add((t, t + lengthS));
        return list.ToArray();
    }
}

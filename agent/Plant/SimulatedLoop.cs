using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Plant;

/// <summary>One loop of the simulated plant: its configuration as the agent would read it, and a process stepped in simulated time.</summary>
public abstract class SimulatedLoop(LoopOptions options)
{
    /// <summary>The loop as configured for the agent.</summary>
    public LoopOptions Options { get; } = options;

    /// <summary>The values the loop shows now.</summary>
    public abstract PlantReading Reading { get; }

    /// <summary>Advances the process and its controller by <paramref name="dt"/> s; <paramref name="t"/> is seconds since the plant started.</summary>
    public abstract void Step(double t, double dt);
}

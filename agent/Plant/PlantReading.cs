using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Plant;

/// <summary>What one simulated loop shows at one instant: PV and SP in engineering units, OP and position in %.</summary>
public readonly record struct PlantReading(double Pv, double Sp, double Op, double Position, LoopMode Mode);

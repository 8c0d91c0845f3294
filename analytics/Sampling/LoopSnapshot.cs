namespace LoopWatch.Analytics.Sampling;

/// <summary>The latest held values of a loop and when it last heard from any tag (UTC ticks, 0 = never).</summary>
public readonly record struct LoopSnapshot(double Pv, double Sp, double Op, double Position, LoopMode Mode, long LastUpdateTicks, long Samples, long BadSamples, long LateValues);

using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Ingest;

/// <summary>A payload decoded: the value, its event time (UTC ticks, 0 when the payload gave none) and quality.</summary>
public readonly record struct DecodedValue(double Value, long Ticks, SampleQuality Quality);

using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Analyze;

/// <summary>One decoded value from a historian file: event time (UTC ticks), where it goes, value and quality.</summary>
public readonly record struct TagRecord(long Ticks, TagRoute Route, double Value, SampleQuality Quality);

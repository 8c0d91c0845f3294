using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Analyze;

/// <summary>One alarm of a loop after the analysis: how often it was annunciated, its state at the end of the data, its priority.</summary>
public readonly record struct LoopAlarmSummary(string Kind, int Activations, string StateAtEnd, AlarmPriority Priority);

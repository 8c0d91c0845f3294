namespace LoopWatch.Agent.Discovery;

/// <summary>A topic discovery heard but put in no loop, and why.</summary>
public readonly record struct UnpairedTopic(string Tag, string Reason);

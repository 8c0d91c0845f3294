using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Discovery;

/// <summary>A loop discovery proposes, in the agent's configuration form, with every reason for what it guessed.</summary>
public sealed record ProposedLoop(LoopOptions Options, IReadOnlyList<string> Reasons);

using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Demo;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent;

/// <summary>Everything the host is built from: checked options, loop specs, the demo run (null for <c>run</c>) and the clock.</summary>
public sealed record AgentSetup(AgentOptions Options, IReadOnlyList<LoopSpec> Specs, DemoRun? Demo, TimeProvider Time);

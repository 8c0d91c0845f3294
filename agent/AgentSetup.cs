using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Demo;
using LoopWatch.Analytics.Configuration;
using Microsoft.Extensions.Configuration;

namespace LoopWatch.Agent;

/// <summary>Everything the host is built from: checked options, loop specs, the demo run (null for <c>run</c>) and the clock.</summary>
public sealed record AgentSetup(AgentOptions Options, IReadOnlyList<LoopSpec> Specs, DemoRun? Demo, TimeProvider Time)
{
    /// <summary>The top-level <c>Logging</c> section of the configuration (console formatter, levels); null for none.</summary>
    public IConfiguration? Logging { get; init; }

    /// <summary>The configuration file to watch for loop changes (<c>run</c> only); null turns reloading off.</summary>
    public ConfigurationSource? Source { get; init; }
}

namespace LoopWatch.Agent.Configuration;

/// <summary>Where the running configuration came from: the file and the command-line overrides applied over it, so a reload reads it the same way.</summary>
public sealed record ConfigurationSource(string File, IReadOnlyDictionary<string, string?> Overrides);

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Tests that set LOOPWATCH__ environment variables or read the configuration they change run one at a time.</summary>
[CollectionDefinition(Name)]
public sealed class EnvironmentCollection
{
    public const string Name = "process environment";
}

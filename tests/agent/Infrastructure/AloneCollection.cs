namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// Tests that hold LOOPWATCH__ environment variables for seconds (a whole verb run): they run when no other test does,
/// since any agent started meanwhile would load its configuration with them.
/// </summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class AloneCollection
{
    public const string Name = "alone: process environment held";
}

namespace LoopWatch.Agent.Demo;

/// <summary>How the demo plant runs: simulated seconds per wall second and the simulated start time.</summary>
public sealed record DemoRun(double Speed, DateTimeOffset Start);

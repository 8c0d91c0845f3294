namespace LoopWatch.Agent;

/// <summary>Parses the verb and dispatches.</summary>
public static class Cli
{
    /// <summary>Runs one verb to completion.</summary>
    public static Task<int> RunAsync(string[] args, TextWriter stdout, TextWriter stderr)
    {
        stderr.WriteLine("usage: loopwatch demo|run");
        return Task.FromResult(2);
    }
}

namespace LoopWatch.Agent;

/// <summary>The <c>loopwatch</c> command: <c>demo</c>, <c>run</c> and the other verbs.</summary>
public static class Program
{
    /// <summary>Entry point; returns 0 on success, 2 for usage or configuration errors.</summary>
    public static Task<int> Main(string[] args) => Cli.RunAsync(args, Console.Out, Console.Error);
}

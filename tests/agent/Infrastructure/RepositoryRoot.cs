namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>The repository checkout the tests run from (the folder holding LoopWatch.sln).</summary>
public static class RepositoryRoot
{
    public static string Path
    {
        get
        {
            var dir = new DirectoryInfo(AppContext.BaseDirectory);
            while (dir is not null && !File.Exists(System.IO.Path.Combine(dir.FullName, "LoopWatch.sln"))) dir = dir.Parent;
            return dir?.FullName ?? throw new InvalidOperationException("repository root not found");
        }
    }
}

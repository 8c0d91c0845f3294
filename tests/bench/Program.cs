using BenchmarkDotNet.Running;

namespace LoopWatch.Bench;

/// <summary>Runs the BenchmarkDotNet suites: <c>dotnet run -c Release --project tests/bench -- --filter '*'</c>.</summary>
public static class BenchProgram
{
    public static void Main(string[] args) => BenchmarkSwitcher.FromAssembly(typeof(BenchProgram).Assembly).Run(args);
}

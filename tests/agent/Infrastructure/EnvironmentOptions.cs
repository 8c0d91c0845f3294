using LoopWatch.Agent.Configuration;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>The agent's options loaded with some LOOPWATCH__ environment variables set (tests in <see cref="EnvironmentCollection"/> only).</summary>
public static class EnvironmentOptions
{
    /// <summary>Sets <paramref name="variables"/> in order, loads the configuration (no file), and clears them in reverse order.</summary>
    public static AgentOptions Load(params (string Name, string Value)[] variables)
    {
        foreach (var (name, value) in variables) Environment.SetEnvironmentVariable(name, value);
        try
        {
            var errors = new List<string>();
            var options = AgentConfiguration.Load(null, new Dictionary<string, string?>(), errors);
            Assert.Empty(errors);
            return options;
        }
        finally
        {
            // Reverse order: a password is never left without its user name.
            foreach (var (name, _) in variables.Reverse()) Environment.SetEnvironmentVariable(name, null);
        }
    }
}

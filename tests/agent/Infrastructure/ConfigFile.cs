using System.Text.Json;
using System.Text.Json.Serialization;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Writes an agent configuration file as an engineer would: the <c>LoopWatch</c> section with broker, dashboard and loops.</summary>
public static class ConfigFile
{
    private static readonly JsonSerializerOptions Json = new() { DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull, WriteIndented = true };

    /// <summary>The file's text for a broker on <paramref name="brokerPort"/>, the dashboard at <paramref name="dashboardUrl"/> and the loops.</summary>
    public static string Text(int brokerPort, string dashboardUrl, IEnumerable<LoopOptions> loops, string clientId = "lw-test") =>
        JsonSerializer.Serialize(new
        {
            LoopWatch = new
            {
                Broker = new { Host = "127.0.0.1", Port = brokerPort, ClientId = $"{clientId}-{Guid.NewGuid():N}" },
                Dashboard = new { Urls = dashboardUrl },
                Loops = loops.ToArray(),
            },
        }, Json);

    /// <summary>Writes the file through a temporary file and a rename, as editors and deployment tools do.</summary>
    public static async Task WriteAsync(string path, string text)
    {
        var temp = path + ".tmp";
        await File.WriteAllTextAsync(temp, text);
        File.Move(temp, path, overwrite: true);
    }
}

using System.Globalization;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// Reads the Prometheus text exposition format (version 0.0.4): one sample per line, <c>name{label="v",...} value</c>,
/// comments starting with '#'. Keys are the series as written, e.g. <c>loopwatch_alarms_active{priority="high"}</c>.
/// </summary>
public static class PrometheusText
{
    public static Dictionary<string, double> Parse(string text)
    {
        var samples = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var raw in text.Split('\n'))
        {
            var line = raw.Trim();
            if (line.Length == 0 || line[0] == '#') continue;
            // The value follows the last space outside the label braces (label values here never hold spaces).
            var cut = line.LastIndexOf(' ');
            var value = line[(cut + 1)..];
            samples[line[..cut]] = value switch
            {
                "+Inf" => double.PositiveInfinity,
                "-Inf" => double.NegativeInfinity,
                _ => double.Parse(value, CultureInfo.InvariantCulture),
            };
        }
        return samples;
    }

    /// <summary>The value of a series, or throws naming it.</summary>
    public static double Get(this Dictionary<string, double> samples, string series) =>
        samples.TryGetValue(series, out var v) ? v : throw new KeyNotFoundException($"series {series} not in the scrape: {string.Join(", ", samples.Keys)}");
}

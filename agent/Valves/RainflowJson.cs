using System.Text.Json;
using LoopWatch.Analytics.Reversals;

namespace LoopWatch.Agent.Valves;

/// <summary>The rainflow state as stored in <c>element_counters.rainflow</c>: bin edges, closed counts and the open residue.</summary>
public sealed record RainflowJson(double[] EdgesPct, double[] Closed, double[] Residue)
{
    /// <summary>Captures a counter's histogram without the residue (that is kept apart so nothing is counted twice).</summary>
    public static RainflowJson From(RainflowCounter rainflow) =>
        new(RainflowCounter.BinEdgesPct.ToArray(), rainflow.Histogram(includeResidue: false), rainflow.Residue.ToArray());

    /// <summary>Serialised text.</summary>
    public string ToJson() => JsonSerializer.Serialize(this);

    /// <summary>Parses stored text; null when absent or from bins this build does not know.</summary>
    public static RainflowJson? Parse(string? json)
    {
        if (string.IsNullOrEmpty(json)) return null;
        try
        {
            var r = JsonSerializer.Deserialize<RainflowJson>(json);
            return r is not null && r.EdgesPct.SequenceEqual(RainflowCounter.BinEdgesPct) ? r : null;
        }
        catch (JsonException)
        {
            return null;
        }
    }
}

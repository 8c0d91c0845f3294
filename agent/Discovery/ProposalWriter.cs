using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace LoopWatch.Agent.Discovery;

/// <summary>
/// Writes a proposal as the agent's own configuration file, with the reasons and the unpaired topics as
/// <c>//</c> comments, which the agent's configuration reader skips.
/// </summary>
public static class ProposalWriter
{
    private static readonly JsonSerializerOptions LoopJson = new() { WriteIndented = true, DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull };

    /// <summary>The configuration text for a broker at <paramref name="host"/>:<paramref name="port"/>.</summary>
    public static string Write(LoopProposal proposal, string host, int port, long messages, double seconds)
    {
        var s = new StringBuilder();
        Comment(s, "", $"Proposed by loopwatch discover from {messages} messages heard on {host}:{port} in {seconds:0.#} s.");
        Comment(s, "", "Nothing here is checked against the plant: review every loop, its reasons and the topics not paired before use.");
        Comment(s, "", $"Not paired ({proposal.Unpaired.Count}):");
        foreach (var u in proposal.Unpaired) Comment(s, "", $"  {u.Tag}: {u.Reason}");
        s.Append("{\n  \"LoopWatch\": {\n");
        s.Append($"    \"Broker\": {{ \"Host\": {JsonSerializer.Serialize(host)}, \"Port\": {port} }},\n");
        s.Append("    \"Loops\": [");
        for (var i = 0; i < proposal.Loops.Count; i++)
        {
            var loop = proposal.Loops[i];
            s.Append(i == 0 ? "\n" : ",\n");
            foreach (var reason in loop.Reasons) Comment(s, "      ", $"{loop.Options.Id}: {reason}");
            var json = JsonSerializer.Serialize(loop.Options, LoopJson).Replace("\r\n", "\n");
            s.Append("      ").Append(json.Replace("\n", "\n      "));
        }
        s.Append(proposal.Loops.Count == 0 ? "]\n" : "\n    ]\n");
        s.Append("  }\n}\n");
        return s.ToString();
    }

    // A topic could hold a line break, which would end the comment early.
    private static void Comment(StringBuilder s, string indent, string text) =>
        s.Append(indent).Append("// ").Append(text.Replace('\n', ' ').Replace('\r', ' ')).Append('\n');
}

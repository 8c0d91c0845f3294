using System.Globalization;
using System.Text.RegularExpressions;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Discovery;

/// <summary>
/// Pairs observed topics into loops by their names (<see cref="TagName"/>), infers the process from ISA-5.1 letters,
/// the kind from the output's values and a PV range from the values seen. It never guesses silently: each loop
/// carries its reasons and every topic left out is listed with why.
/// </summary>
public static partial class LoopProposer
{
    /// <summary>Builds the proposal from what was heard.</summary>
    public static LoopProposal Propose(IReadOnlyList<ObservedTopic> topics)
    {
        var loops = new List<ProposedLoop>();
        var unpaired = new List<UnpairedTopic>();
        var groups = new Dictionary<string, List<(TagName Name, ObservedTopic Topic)>>(StringComparer.Ordinal);
        foreach (var t in topics)
        {
            if (t.Values == 0) { unpaired.Add(new(t.Tag, "no readable value (not a number, true/false or auto/manual)")); continue; }
            if (!TagName.TryParse(t.Tag, out var name)) { unpaired.Add(new(t.Tag, "its name does not end in a loop part (pv, sp, op, out, mv, cv, mode, zt)")); continue; }
            if (!groups.TryGetValue(name.LoopKey, out var list)) groups[name.LoopKey] = list = [];
            list.Add((name, t));
        }
        // Ids must be unique; the same tag name under two roots keeps its whole key as id.
        var idCounts = groups.Values.GroupBy(g => g[0].Name.LoopId, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
        foreach (var (key, members) in groups.OrderBy(g => g.Key, StringComparer.Ordinal))
        {
            var id = members[0].Name.LoopId;
            if (idCounts[id] > 1) id = key;
            var proposed = Pair(id, members, unpaired);
            if (proposed is not null) loops.Add(proposed);
        }
        return new LoopProposal(loops, unpaired.OrderBy(u => u.Tag, StringComparer.Ordinal).ToList());
    }

    private static ProposedLoop? Pair(string id, List<(TagName Name, ObservedTopic Topic)> members, List<UnpairedTopic> unpaired)
    {
        var reasons = new List<string>();
        var parts = new Dictionary<TagRole, ObservedTopic>();
        foreach (var (name, topic) in members)
        {
            if (parts.TryAdd(name.Role, topic)) continue;
            unpaired.Add(new(topic.Tag, $"a second {name.Role.ToString().ToLowerInvariant()} topic for {id} (kept {parts[name.Role].Tag})"));
        }
        if (parts.Remove(TagRole.Cv, out var cv))
        {
            // cv means the measurement in advanced-control usage and the output for some controller makers: only the other parts decide.
            if (!parts.ContainsKey(TagRole.Pv) && parts.ContainsKey(TagRole.Op))
            {
                parts[TagRole.Pv] = cv;
                reasons.Add($"{cv.Tag} read as the controlled variable (PV), since the loop has a separate output");
            }
            else if (parts.ContainsKey(TagRole.Pv) && !parts.ContainsKey(TagRole.Op))
            {
                parts[TagRole.Op] = cv;
                reasons.Add($"{cv.Tag} read as the control value (output), since the loop has a separate pv");
            }
            else unpaired.Add(new(cv.Tag, $"cv is ambiguous for {id} (controlled variable or control value)"));
        }

        var pattern = members[0].Name.Pattern;
        if (!parts.TryGetValue(TagRole.Pv, out var pv) || !parts.TryGetValue(TagRole.Op, out var op) || pv.Numbers == 0)
        {
            var why = pv is { Numbers: 0 } ? "its pv carries no numbers" : $"only {string.Join(", ", parts.Keys.Select(k => k.ToString().ToLowerInvariant()))} found; a loop needs pv and op";
            foreach (var t in parts.Values) unpaired.Add(new(t.Tag, $"{id}: {why}"));
            return null;
        }
        reasons.Add($"topics {string.Join(", ", parts.Values.Select(t => t.Tag))} by the pattern {pattern}");

        var onOff = op.Values > 0 && op.ModeWords == 0 && op.OnlyZeroOrOne;
        var kind = onOff ? "on-off" : "pid";
        reasons.Add(onOff
            ? $"Kind on-off: the output only carried 0/1 or true/false ({Count(op.Values)})"
            : $"Kind pid: the output carried {(op.Min == op.Max ? Figure(op.Min) : $"values from {Figure(op.Min)} to {Figure(op.Max)}")} ({Count(op.Values)})");
        parts.TryGetValue(TagRole.Sp, out var sp);
        if (!onOff && sp is null)
        {
            foreach (var t in parts.Values) unpaired.Add(new(t.Tag, $"{id}: a pid loop needs a set point and none was found"));
            return null;
        }

        var process = Process(id, out var processReason);
        reasons.Add(processReason);

        var (min, max, rangeReason) = Range(pv, sp);
        reasons.Add(rangeReason);

        var options = new LoopOptions
        {
            Id = id,
            Description = $"{id} (proposed by discover: review)",
            Kind = kind,
            Process = process,
            Pv = new SignalOptions { Tag = pv.Tag, Min = min, Max = max },
            Sp = sp is null ? null : new SignalOptions { Tag = sp.Tag },
            Op = new SignalOptions { Tag = op.Tag },
            Mode = parts.TryGetValue(TagRole.Mode, out var mode) ? new SignalOptions { Tag = mode.Tag } : null,
            Position = parts.TryGetValue(TagRole.Position, out var position) ? new SignalOptions { Tag = position.Tag } : null,
        };
        return new ProposedLoop(options, reasons);
    }

    /// <summary>The process kind from the ISA-5.1 first letter of a tag name (F flow, L level, P pressure, T temperature).</summary>
    public static string Process(string id, out string reason)
    {
        var m = IsaTag().Match(id);
        if (!m.Success)
        {
            reason = $"Process other: '{id}' has no ISA-5.1 letters followed by a loop number";
            return "other";
        }
        var letter = char.ToUpperInvariant(m.Groups[1].Value[0]);
        // ISA-5.1 first letters (measured variable): F flow, L level, P pressure, T temperature.
        var process = letter switch { 'F' => "flow", 'L' => "level", 'P' => "pressure", 'T' => "temperature", _ => "other" };
        reason = process == "other"
            ? $"Process other: ISA-5.1 first letter {letter} in {id} is none of F, L, P, T"
            : $"Process {process}: ISA-5.1 first letter {letter} in {id}";
        return process;
    }

    private static (double Min, double Max, string Reason) Range(ObservedTopic pv, ObservedTopic? sp)
    {
        var lo = pv.Min;
        var hi = pv.Max;
        if (sp is { Numbers: > 0 }) { lo = Math.Min(lo, sp.Min); hi = Math.Max(hi, sp.Max); }
        double low, high;
        string reason;
        if (hi > lo)
        {
            var span = hi - lo;
            low = lo >= 0 ? Math.Max(0, lo - span * 0.1) : lo - span * 0.1;
            high = hi + span * 0.1;
            reason = $"from the values seen ({Figure(lo)} to {Figure(hi)}) widened by 10 %";
        }
        else
        {
            // One value tells nothing of the span: a placeholder from zero to twice it.
            low = Math.Min(0, 2 * lo);
            high = Math.Max(0, 2 * hi);
            if (high == low) high = 1;
            reason = $"a placeholder, only {Figure(lo)} was seen";
        }
        // Round outwards to a tenth of the span's decade, so the range reads like an instrument range.
        var decade = (int)Math.Floor(Math.Log10(high - low)) - 1;
        var step = Math.Pow(10, decade);
        var digits = Math.Clamp(-decade, 0, 15);
        var min = Math.Round(Math.Floor(low / step) * step, digits);
        var max = Math.Round(Math.Ceiling(high / step) * step, digits);
        return (min, max, $"Pv:Min/Max {Figure(min)}..{Figure(max)} {reason}: set them from the transmitter's calibrated range");
    }

    private static string Count(long n) => n == 1 ? "1 value" : $"{n} values";

    private static string Figure(double v) => v.ToString("0.###", CultureInfo.InvariantCulture);

    [GeneratedRegex(@"^([A-Za-z])[A-Za-z]{1,4}[-_ ]?\d+[A-Za-z]?$")]
    private static partial Regex IsaTag();
}

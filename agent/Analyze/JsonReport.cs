using System.Text.Json;
using LoopWatch.Dashboard.Api;

namespace LoopWatch.Agent.Analyze;

/// <summary>The analysis as JSON, snake_case as the HTTP API (<see cref="ApiJson.Options"/>): loops, then what was rejected.</summary>
public static class JsonReport
{
    /// <summary>Writes the report to <paramref name="output"/>.</summary>
    public static void Write(AnalysisResult result, Stream output)
    {
        var r = result.Rejects;
        var doc = new
        {
            files = result.Files,
            rows = result.Rows,
            values = result.Values,
            alarms = result.AlarmNote,
            loops = ReportOrder.Sorted(result.Loops).Select(l => new
            {
                id = l.Spec.Id,
                kind = l.Kind,
                process = l.Spec.Process.ToString().ToLowerInvariant(),
                description = l.Spec.Description,
                unit = l.Spec.Unit,
                samples = l.Samples,
                from = l.From,
                to = l.To,
                stats = l.Stats,
                // The advice is the monitor's at the end of the data; listed once, beside rather than inside window_stats.
                window_stats = l.WindowStats with { Advice = null },
                advice = l.WindowStats.Advice,
                findings = l.Findings.Select(f => (object)f).ToArray(),
                alarms = result.AlarmsOf(l.Spec.Id),
            }).ToArray(),
            alarm_transitions = result.AlarmJournal.Count,
            rejected = new
            {
                rows = r.Rows,
                examples = r.Examples,
                unknown_tags = new { values = r.UnknownValues, count = r.UnknownTagCount, tags = r.UnknownTags.Select(t => new { tag = t.Key, values = t.Value }).ToArray() },
                out_of_order = r.OutOfOrder,
                late = result.Late,
                outside_range = result.OutsideRange,
                files = r.FileErrors,
            },
        };
        // Tag names are data: a list of objects, never dictionary keys, which the snake_case key policy would rewrite.
        JsonSerializer.Serialize(output, doc, ApiJson.Options);
    }
}

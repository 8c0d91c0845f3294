using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Ingest;

namespace LoopWatch.Agent.Analyze;

/// <summary>The outcome of one offline analysis: per-loop results, what was skipped, and the plant state it ran through.</summary>
public sealed record AnalysisResult(
    IReadOnlyList<LoopResult> Loops,
    RowRejects Rejects,
    IReadOnlyList<string> Files,
    long Rows,
    long Values,
    long OutsideRange,
    long Late,
    PlantState Plant,
    AlarmEngine Alarms,
    AlarmRecord AlarmJournal)
{
    /// <summary>True when at least one value reached a loop.</summary>
    public bool AnythingAnalysed => Values > 0;

    /// <summary>The alarms of one loop that were annunciated at least once or are not normal at the end.</summary>
    public IReadOnlyList<LoopAlarmSummary> AlarmsOf(string loopId)
    {
        var statuses = new List<AlarmStatus>();
        Alarms.Loop(loopId)?.Collect(statuses);
        return statuses
            .Select(s => new LoopAlarmSummary(s.Kind, AlarmJournal.Activations.GetValueOrDefault(s.Id), AlarmNames.Of(s.State), s.Priority))
            .Where(a => a.Activations > 0 || a.StateAtEnd != AlarmNames.Of(AlarmState.Normal))
            .ToList();
    }

    /// <summary>What the alarm figures mean.</summary>
    public string AlarmNote => $"findings went through the alarm engine as live: {AlarmJournal.Activations.Values.Sum()} alarm activation(s) the agent would have annunciated";
}

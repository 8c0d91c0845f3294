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
    PlantState Plant)
{
    /// <summary>True when at least one value reached a loop.</summary>
    public bool AnythingAnalysed => Values > 0;

    /// <summary>The alarm engine's verdict is not part of this build yet; the report says so.</summary>
    public string AlarmNote => "alarm engine not in this build: findings are reported as the detectors raised them";
}

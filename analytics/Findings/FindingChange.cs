namespace LoopWatch.Analytics.Findings;

/// <summary>A finding raised, updated with new figures, or ended on a loop.</summary>
public readonly record struct FindingChange(string LoopId, FindingChangeKind Change, Finding Finding);

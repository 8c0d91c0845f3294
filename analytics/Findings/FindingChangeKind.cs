namespace LoopWatch.Analytics.Findings;

/// <summary>What happened to a finding.</summary>
public enum FindingChangeKind : byte
{
    Raised,
    Updated,
    Ended,
}

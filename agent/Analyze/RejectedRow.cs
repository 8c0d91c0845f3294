namespace LoopWatch.Agent.Analyze;

/// <summary>A row that could not be read: file, line number (1-based) and why.</summary>
public sealed record RejectedRow(string File, int Line, string Reason);

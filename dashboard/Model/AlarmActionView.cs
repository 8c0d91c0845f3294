namespace LoopWatch.Dashboard.Model;

/// <summary>The answer to an alarm action: accepted with from/to states, or refused with why.</summary>
public sealed record AlarmActionView(bool Accepted, string From, string To, string? Refusal);

namespace LoopWatch.Dashboard.Reports;

/// <summary>One alarm's state over a period: the state it left first, the state it ended in, how many transitions.</summary>
public sealed record AlarmChange(string LoopId, string Kind, string Priority, string StartState, string EndState, int Transitions);

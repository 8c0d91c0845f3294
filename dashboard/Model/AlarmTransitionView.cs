namespace LoopWatch.Dashboard.Model;

/// <summary>One alarm state change as the API shows it.</summary>
public sealed record AlarmTransitionView(
    DateTimeOffset Time, string Id, string LoopId, string Kind, string Priority, string From, string To,
    string Trigger, string? User, string? Comment);

namespace LoopWatch.Dashboard.Model;

/// <summary>One alarm as the API shows it; <see cref="FiguresJson"/> is the finding behind the last activation.</summary>
public sealed record AlarmView(
    string Id,
    string LoopId,
    string Kind,
    string State,
    string Priority,
    bool ConditionActive,
    DateTimeOffset? Raised,
    string? AckedBy,
    DateTimeOffset? ShelvedUntil,
    string? ShelvedBy,
    string? Comment,
    DateTimeOffset? Updated,
    string? FiguresJson);

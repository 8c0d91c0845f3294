using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Alarms;

/// <summary>One alarm (loop, finding kind): its state, who touched it, and the on/off-delay timers of its condition.</summary>
internal sealed class AlarmPoint(string loopId, string kind, AlarmPriority priority)
{
    public const long Unset = long.MinValue;

    public string LoopId { get; } = loopId;
    public string Kind { get; } = kind;
    public AlarmPriority Priority { get; } = priority;
    public AlarmState State;
    public bool ConditionActive;
    public long RawSince = Unset;
    public long ClearSince = Unset;
    public long RaisedTicks;
    public string? AckedBy;
    public long ShelvedUntilTicks;
    public string? ShelvedBy;
    public string? Comment;
    public long UpdatedTicks;
    public string? FiguresJson;

    /// <summary>Forgets the condition so the next evaluation starts afresh (after shelving, suppression, service).</summary>
    public void ResetCondition()
    {
        ConditionActive = false;
        RawSince = Unset;
        ClearSince = Unset;
    }

    public AlarmStatus Status() => new(LoopId, Kind, State, Priority, ConditionActive, RaisedTicks, AckedBy,
        ShelvedUntilTicks, ShelvedBy, Comment, UpdatedTicks, FiguresJson);
}

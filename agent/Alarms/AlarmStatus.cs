using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// One alarm at one moment. Times are UTC ticks of event time, 0 when unset. <see cref="ShelvedBy"/> also names who
/// took the alarm out of service; <see cref="FiguresJson"/> holds the figures of the finding behind the last activation.
/// </summary>
public readonly record struct AlarmStatus(
    string LoopId,
    string Kind,
    AlarmState State,
    AlarmPriority Priority,
    bool ConditionActive,
    long RaisedTicks,
    string? AckedBy,
    long ShelvedUntilTicks,
    string? ShelvedBy,
    string? Comment,
    long UpdatedTicks,
    string? FiguresJson)
{
    /// <summary>The alarm's id, <c>loop:kind</c>.</summary>
    public string Id => LoopId + ":" + Kind;
}

namespace LoopWatch.Agent.Alarms;

/// <summary>One journaled state change (event time in UTC ticks) with the alarm's status after it.</summary>
public readonly record struct AlarmTransition(
    long Ticks,
    AlarmState From,
    AlarmTrigger Trigger,
    string? User,
    string? Comment,
    AlarmStatus After);

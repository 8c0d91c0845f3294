namespace LoopWatch.Agent.Alarms;

/// <summary>Hears every alarm transition (the journal); called under the loop's alarm lock, so it must not block.</summary>
public interface IAlarmSink
{
    /// <summary>One transition happened.</summary>
    void Transitioned(in AlarmTransition transition);
}

using LoopWatch.Agent.Alarms;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Agent.Storage;

/// <summary>Journals every alarm transition and upserts the alarm's current state through the storage writer.</summary>
public sealed class AlarmJournal(AgentStorage storage) : IAlarmSink
{
    /// <inheritdoc />
    public void Transitioned(in AlarmTransition t)
    {
        var a = t.After;
        var priority = a.Priority.ToString().ToLowerInvariant();
        var figures = t.Trigger is AlarmTrigger.Activate or AlarmTrigger.Clear ? a.FiguresJson : null;
        storage.Writer.Post(new AlarmJournalEntry(UnixMs.FromTicks(t.Ticks), a.LoopId, a.Kind, priority,
            AlarmNames.Of(t.From), AlarmNames.Of(a.State), figures, t.User, t.Comment));
        storage.Writer.Post(ToRow(a));
    }

    /// <summary>The stored form of a status.</summary>
    public static AlarmStateRow ToRow(in AlarmStatus a) => new(a.LoopId, a.Kind, AlarmNames.Of(a.State),
        a.Priority.ToString().ToLowerInvariant(), a.RaisedTicks == 0 ? null : UnixMs.FromTicks(a.RaisedTicks), a.AckedBy,
        a.ShelvedUntilTicks == 0 ? null : UnixMs.FromTicks(a.ShelvedUntilTicks), a.ShelvedBy, a.Comment, UnixMs.FromTicks(a.UpdatedTicks));

    /// <summary>The status a stored row describes; null when its state text is unknown.</summary>
    public static AlarmStatus? FromRow(in AlarmStateRow r)
    {
        if (!AlarmNames.TryState(r.State, out var state)) return null;
        Enum.TryParse<AlarmPriority>(r.Priority, true, out var priority);
        return new AlarmStatus(r.LoopId, r.Kind, state, priority, state is AlarmState.Unacknowledged or AlarmState.Acknowledged,
            r.RaisedMs is { } raised ? UnixMs.ToTicks(raised) : 0, r.AckedBy,
            r.ShelvedUntilMs is { } until ? UnixMs.ToTicks(until) : 0, r.ShelvedBy, r.Comment, UnixMs.ToTicks(r.UpdatedMs), null);
    }
}

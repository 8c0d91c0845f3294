namespace LoopWatch.Dashboard.Model;

/// <summary>The alarms the dashboard shows and acts on; the agent implements it.</summary>
public interface IAlarmView
{
    /// <summary>Every alarm, or only those not in normal.</summary>
    IReadOnlyList<AlarmView> Alarms(bool activeOnly);

    /// <summary>Transitions with event time at or after <paramref name="since"/>, oldest first (those still held in memory).</summary>
    IReadOnlyList<AlarmTransitionView> Transitions(DateTimeOffset since);

    /// <summary>Acknowledges the alarm <c>loop:kind</c>.</summary>
    AlarmActionView Acknowledge(string id, string user, string? comment);

    /// <summary>Shelves the alarm <c>loop:kind</c> for <paramref name="duration"/> of plant time.</summary>
    AlarmActionView Shelve(string id, string user, string? comment, TimeSpan duration);

    /// <summary>Alarm-system figures over the last <paramref name="window"/> of plant time, from the journal.</summary>
    Task<AlarmHealthReport> HealthAsync(TimeSpan window, CancellationToken cancellationToken);
}

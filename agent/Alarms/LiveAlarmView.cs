using LoopWatch.Dashboard.Reports;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Storage;
using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Reading;

namespace LoopWatch.Agent.Alarms;

/// <summary>The dashboard's view of the live alarm engine: user actions at the plant's time, health from the stored journal.</summary>
public sealed class LiveAlarmView(AlarmEngine engine, PlantClock clock, AgentStorage storage) : IAlarmView
{
    /// <inheritdoc />
    public IReadOnlyList<AlarmView> Alarms(bool activeOnly) => engine.Alarms(activeOnly).Select(ToView).ToList();

    /// <inheritdoc />
    public IReadOnlyList<AlarmTransitionView> Transitions(DateTimeOffset since) =>
        engine.Transitions(since.UtcTicks).Select(t => new AlarmTransitionView(Time(t.Ticks)!.Value, t.After.Id, t.After.LoopId,
            t.After.Kind, t.After.Priority.ToString().ToLowerInvariant(), AlarmNames.Of(t.From), AlarmNames.Of(t.After.State),
            AlarmNames.Of(t.Trigger), t.User, t.Comment)).ToList();

    /// <inheritdoc />
    public AlarmActionView Acknowledge(string id, string user, string? comment) =>
        ToView(engine.Act(id, AlarmTrigger.Acknowledge, clock.NowTicks, user, comment));

    /// <inheritdoc />
    public AlarmActionView Shelve(string id, string user, string? comment, TimeSpan duration)
    {
        var now = clock.NowTicks;
        return ToView(engine.Act(id, AlarmTrigger.Shelve, now, user, comment, now + duration.Ticks));
    }

    /// <inheritdoc />
    public async Task<AlarmHealthReport> HealthAsync(TimeSpan window, CancellationToken cancellationToken)
    {
        var to = UnixMs.FromTicks(clock.NowTicks) + 1;
        var from = to - (long)window.TotalMilliseconds;
        var rows = await storage.Reader.ReadJournalAsync(new JournalQuery(from, to, Limit: 1_000_000, OldestFirst: true), cancellationToken);
        return AlarmHealth.Compute(rows, from, to);
    }

    private static AlarmView ToView(AlarmStatus a) => new(a.Id, a.LoopId, a.Kind, AlarmNames.Of(a.State),
        a.Priority.ToString().ToLowerInvariant(), a.ConditionActive, Time(a.RaisedTicks), a.AckedBy, Time(a.ShelvedUntilTicks),
        a.ShelvedBy, a.Comment, Time(a.UpdatedTicks), a.FiguresJson);

    private static AlarmActionView ToView(AlarmActionResult r) => new(r.Accepted, AlarmNames.Of(r.From), AlarmNames.Of(r.To), r.Refusal);

    private static DateTimeOffset? Time(long ticks) => ticks == 0 ? null : new DateTimeOffset(ticks, TimeSpan.Zero);
}

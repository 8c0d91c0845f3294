using System.Text.Json;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// The alarms of one loop, one per finding kind that applies to its loop kind, driven by event time passed in.
/// Thread-safe: evaluation (ingest) and user actions (API) take the same lock.
/// </summary>
public sealed class LoopAlarms
{
    private static readonly JsonSerializerOptions FigureJson = new() { PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower };

    private readonly Lock _gate = new();
    private readonly bool _shared;
    private readonly AlarmPoint[] _points;
    private readonly IAlarmSink _sink;
    private readonly long _onDelay, _offDelay;
    private readonly TimeZoneInfo _zone;
    private long _now;
    private bool _retired;
    private readonly bool _alwaysInWindow;
    // Every point normal with no condition pending, as of the last full pass (cleared by any user action or restore).
    private bool _quiet;

    /// <summary>
    /// The alarms of <paramref name="spec"/>; every transition goes to <paramref name="sink"/>; <paramref name="shared"/>
    /// false when one thread evaluates and reads them (offline analysis), which skips the lock on evaluation.
    /// </summary>
    public LoopAlarms(LoopSpec spec, IAlarmSink sink, bool shared = true)
    {
        Spec = spec;
        _shared = shared;
        _sink = sink;
        _onDelay = (long)(spec.Alarms.OnDelaySeconds * TimeSpan.TicksPerSecond);
        _offDelay = (long)(spec.Alarms.OffDelaySeconds * TimeSpan.TicksPerSecond);
        _zone = TimeZoneInfo.FindSystemTimeZoneById(spec.Alarms.TimeZone);
        _points = KindsFor(spec.Kind).Select(k => new AlarmPoint(spec.Id, k, spec.Alarms.PriorityOf(k))).ToArray();
        _alwaysInWindow = spec.Alarms.ActiveWhen.Count == 0;
    }

    /// <summary>The loop.</summary>
    public LoopSpec Spec { get; }

    /// <summary>The finding kinds that can alarm on a loop of this kind.</summary>
    public static IReadOnlyList<string> KindsFor(LoopKind kind) => kind == LoopKind.OnOff
        ? [FindingKinds.Stale, FindingKinds.OutOfRange, FindingKinds.Frozen, FindingKinds.ShortCycling]
        : [FindingKinds.Stale, FindingKinds.OutOfRange, FindingKinds.Frozen, FindingKinds.Oscillation,
           FindingKinds.ExcessiveReversals, FindingKinds.SustainedOffset, FindingKinds.Saturation];

    /// <summary>
    /// Evaluates every alarm at event time <paramref name="ticks"/> (earlier times are taken as the latest seen) from the
    /// loop's mode, its board and, for the deadband, its statistics and PV.
    /// </summary>
    public void Evaluate(long ticks, LoopMode mode, FindingBoard board, Func<LoopStatistics>? statistics = null, double pv = double.NaN)
    {
        if (!_shared) { EvaluateAll(ticks, mode, board, statistics, pv); return; }
        lock (_gate) EvaluateAll(ticks, mode, board, statistics, pv);
    }

    private void EvaluateAll(long ticks, LoopMode mode, FindingBoard board, Func<LoopStatistics>? statistics, double pv)
    {
        if (_retired) return;
        ticks = Advance(ticks);
        // The common case, a healthy loop: with no finding, not in manual and every point quiet, a full pass changes
        // nothing, and skipping it keeps the alarm points out of the cache (10,000 loops do not fit).
        if (_quiet && board.Active.Count == 0 && mode != LoopMode.Manual && _alwaysInWindow) return;
        var stale = board.IsActive(FindingKinds.Stale);
        var outside = !InWindow(ticks);
        foreach (var p in _points)
        {
            if (p.State == AlarmState.Shelved && ticks >= p.ShelvedUntilTicks)
                Apply(p, AlarmTrigger.Unshelve, ticks, null, "shelf expired");
            // The stale alarm reports the data path, so only the operating window holds it back.
            var suppressed = outside || (p.Kind != FindingKinds.Stale && (mode == LoopMode.Manual || stale));
            if (suppressed)
            {
                if (p.State is AlarmState.Normal or AlarmState.Unacknowledged or AlarmState.Acknowledged or AlarmState.ReturnedUnacknowledged)
                    Apply(p, AlarmTrigger.Suppress, ticks, null, null);
                continue;
            }
            if (p.State == AlarmState.SuppressedByDesign) Apply(p, AlarmTrigger.Unsuppress, ticks, null, null);
            if (p.State is AlarmState.Shelved or AlarmState.OutOfService) continue;
            var finding = board.Get(p.Kind);
            var raw = finding is not null || (p.ConditionActive && AlarmDeadband.Holds(p.Kind, Spec, statistics, pv));
            Debounce(p, raw, finding, ticks);
        }
        _quiet = true;
        foreach (var p in _points)
            if (p.State != AlarmState.Normal || p.ConditionActive || p.RawSince != AlarmPoint.Unset || p.ClearSince != AlarmPoint.Unset) _quiet = false;
    }

    /// <summary>Applies a user action (acknowledge, shelve until <paramref name="untilTicks"/>, unshelve, remove from or return to service).</summary>
    public AlarmActionResult Act(string kind, AlarmTrigger trigger, long ticks, string user, string? comment, long untilTicks = 0)
    {
        if (trigger is AlarmTrigger.Activate or AlarmTrigger.Clear or AlarmTrigger.Suppress or AlarmTrigger.Unsuppress)
            return AlarmActionResult.Refuse(AlarmState.Normal, $"{AlarmNames.Of(trigger)} is not a user action");
        lock (_gate)
        {
            _quiet = false;
            var p = Find(kind);
            if (p is null) return AlarmActionResult.Refuse(AlarmState.Normal, $"loop {Spec.Id} has no {kind} alarm");
            if (_retired) return AlarmActionResult.Refuse(p.State, $"loop {Spec.Id} left the configuration");
            ticks = Advance(ticks);
            if (trigger == AlarmTrigger.Shelve && untilTicks <= ticks) return AlarmActionResult.Refuse(p.State, "the shelf must end in the future");
            return Apply(p, trigger, ticks, user, comment, untilTicks);
        }
    }

    /// <summary>
    /// Ends the loop's alarms when it leaves the configuration: each alarm not in normal is taken out of service and returned
    /// to service (so it ends in normal), both journaled with <paramref name="comment"/>; nothing is evaluated afterwards.
    /// </summary>
    public void Retire(long ticks, string comment)
    {
        lock (_gate)
        {
            _quiet = false;
            _retired = true;
            ticks = Advance(ticks);
            foreach (var p in _points)
            {
                if (p.State == AlarmState.Normal) continue;
                if (p.State != AlarmState.OutOfService) Apply(p, AlarmTrigger.RemoveFromService, ticks, null, comment);
                Apply(p, AlarmTrigger.ReturnToService, ticks, null, comment);
            }
        }
    }

    /// <summary>The alarms now.</summary>
    public void Collect(List<AlarmStatus> into)
    {
        lock (_gate) foreach (var p in _points) into.Add(p.Status());
    }

    /// <summary>
    /// Takes back a stored state after a restart without journaling it: active, acknowledged and shelved alarms keep their
    /// state (their condition counts as active until the off-delay says otherwise); suppression is evaluated afresh.
    /// </summary>
    public void Restore(in AlarmStatus stored)
    {
        lock (_gate)
        {
            _quiet = false;
            var p = Find(stored.Kind);
            if (p is null || stored.State == AlarmState.SuppressedByDesign) return;
            p.State = stored.State;
            p.RaisedTicks = stored.RaisedTicks;
            p.AckedBy = stored.AckedBy;
            p.ShelvedUntilTicks = stored.ShelvedUntilTicks;
            p.ShelvedBy = stored.ShelvedBy;
            p.Comment = stored.Comment;
            p.UpdatedTicks = stored.UpdatedTicks;
            p.ResetCondition();
            p.ConditionActive = stored.State is AlarmState.Unacknowledged or AlarmState.Acknowledged;
            _now = Math.Max(_now, stored.UpdatedTicks);
        }
    }

    private void Debounce(AlarmPoint p, bool raw, Finding? finding, long ticks)
    {
        if (raw)
        {
            p.ClearSince = AlarmPoint.Unset;
            if (p.ConditionActive) return;
            if (p.RawSince == AlarmPoint.Unset) p.RawSince = ticks;
            if (ticks - p.RawSince < _onDelay) return;
            p.ConditionActive = true;
            if (finding is not null) p.FiguresJson = JsonSerializer.Serialize(finding, finding.GetType(), FigureJson);
            if (p.State is AlarmState.Normal or AlarmState.ReturnedUnacknowledged) Apply(p, AlarmTrigger.Activate, ticks, null, null);
        }
        else
        {
            p.RawSince = AlarmPoint.Unset;
            if (!p.ConditionActive) return;
            if (p.ClearSince == AlarmPoint.Unset) p.ClearSince = ticks;
            if (ticks - p.ClearSince < _offDelay) return;
            p.ConditionActive = false;
            if (p.State is AlarmState.Unacknowledged or AlarmState.Acknowledged) Apply(p, AlarmTrigger.Clear, ticks, null, null);
        }
    }

    private AlarmActionResult Apply(AlarmPoint p, AlarmTrigger trigger, long ticks, string? user, string? comment, long untilTicks = 0)
    {
        var from = p.State;
        if (!AlarmStateMachine.TryNext(from, trigger, out var to))
            return AlarmActionResult.Refuse(from, $"{AlarmNames.Of(trigger)} is not allowed in state {AlarmNames.Of(from)}");
        p.State = to;
        p.UpdatedTicks = ticks;
        switch (trigger)
        {
            case AlarmTrigger.Activate: p.RaisedTicks = ticks; p.AckedBy = null; p.Comment = null; break;
            case AlarmTrigger.Acknowledge: p.AckedBy = user; p.Comment = comment; break;
            case AlarmTrigger.Shelve:
            case AlarmTrigger.RemoveFromService:
                p.ShelvedBy = user; p.ShelvedUntilTicks = untilTicks; p.Comment = comment; p.ResetCondition(); break;
            case AlarmTrigger.Unshelve:
            case AlarmTrigger.ReturnToService:
                p.ShelvedBy = null; p.ShelvedUntilTicks = 0; p.ResetCondition(); break;
            case AlarmTrigger.Suppress:
            case AlarmTrigger.Unsuppress:
                p.ResetCondition(); break;
        }
        if (to == AlarmState.Normal) { p.RaisedTicks = 0; p.AckedBy = null; }
        _sink.Transitioned(new AlarmTransition(ticks, from, trigger, user, comment, p.Status()));
        return new AlarmActionResult(true, from, to, null);
    }

    private bool InWindow(long ticks)
    {
        var windows = Spec.Alarms.ActiveWhen;
        if (windows.Count == 0) return true;
        var local = TimeZoneInfo.ConvertTime(new DateTimeOffset(ticks, TimeSpan.Zero), _zone);
        var minute = local.Hour * 60 + local.Minute;
        foreach (var w in windows) if (w.Contains(minute)) return true;
        return false;
    }

    private long Advance(long ticks)
    {
        if (ticks > _now) _now = ticks;
        return _now;
    }

    private AlarmPoint? Find(string kind)
    {
        foreach (var p in _points) if (p.Kind == kind) return p;
        return null;
    }
}

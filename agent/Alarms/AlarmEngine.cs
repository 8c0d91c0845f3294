using LoopWatch.Agent.Configuration;
using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// The alarms of all loops. Driven only by event time passed in (live ingest and offline analysis alike); keeps the
/// latest transitions in memory for the API and forwards each one to the sinks (the journal).
/// </summary>
public sealed class AlarmEngine : IAlarmSink
{
    // Replaced whole by Reconfigure, never changed in place.
    private Dictionary<string, LoopAlarms> _loops;
    private readonly object _reconfigureGate = new();
    private readonly IAlarmSink[] _sinks;
    private readonly AlarmTransition[] _recent;
    private readonly object _recentGate = new();
    private long _count;

    /// <summary>
    /// Alarms for <paramref name="specs"/>; the newest <paramref name="recentCapacity"/> transitions are kept in memory;
    /// <paramref name="shared"/> false when one thread does everything (offline analysis).
    /// </summary>
    public AlarmEngine(IEnumerable<LoopSpec> specs, IEnumerable<IAlarmSink>? sinks = null, int recentCapacity = 10_000, bool shared = true)
    {
        _sinks = sinks?.ToArray() ?? [];
        _recent = new AlarmTransition[Math.Max(1, recentCapacity)];
        _loops = specs.ToDictionary(s => s.Id, s => new LoopAlarms(s, this, shared), StringComparer.Ordinal);
    }

    /// <summary>Transitions since start.</summary>
    public long TransitionCount => Interlocked.Read(ref _count);

    /// <summary>The alarms of one loop, or null.</summary>
    public LoopAlarms? Loop(string loopId) => _loops.GetValueOrDefault(loopId);

    /// <summary>Every loop's alarms.</summary>
    public IEnumerable<LoopAlarms> Loops => _loops.Values;

    /// <summary>Every alarm now, or only those not in normal.</summary>
    public List<AlarmStatus> Alarms(bool activeOnly = false)
    {
        var all = new List<AlarmStatus>();
        foreach (var l in _loops.Values) l.Collect(all);
        if (activeOnly) all.RemoveAll(a => a.State == AlarmState.Normal);
        return all;
    }

    /// <summary>The transitions kept in memory with event time at or after <paramref name="sinceTicks"/>, oldest first.</summary>
    public List<AlarmTransition> Transitions(long sinceTicks)
    {
        lock (_recentGate)
        {
            var n = (int)Math.Min(_count, _recent.Length);
            var list = new List<AlarmTransition>(n);
            for (var i = _count - n; i < _count; i++)
            {
                var t = _recent[i % _recent.Length];
                if (t.Ticks >= sinceTicks) list.Add(t);
            }
            return list;
        }
    }

    /// <summary>Applies a user action to the alarm <c>loop:kind</c>.</summary>
    public AlarmActionResult Act(string id, AlarmTrigger trigger, long ticks, string user, string? comment, long untilTicks = 0)
    {
        var cut = id.LastIndexOf(':');
        if (cut <= 0 || _loops.GetValueOrDefault(id[..cut]) is not { } loop)
            return AlarmActionResult.Refuse(AlarmState.Normal, $"no alarm '{id}'");
        if (string.IsNullOrWhiteSpace(user)) return AlarmActionResult.Refuse(AlarmState.Normal, "a user name is required");
        return loop.Act(id[(cut + 1)..], trigger, ticks, user, comment, untilTicks);
    }

    /// <summary>
    /// Takes a new set of loops while running: alarms of removed and changed loops are retired (see
    /// <see cref="LoopAlarms.Retire"/>), new and changed loops get fresh alarms, kept loops keep theirs.
    /// </summary>
    public void Reconfigure(IReadOnlyList<LoopSpec> specs, LoopSetChange change, long ticks)
    {
        lock (_reconfigureGate)
        {
            var old = _loops;
            foreach (var id in change.Removed) old[id].Retire(ticks, "loop removed from the configuration");
            foreach (var id in change.Changed) old[id].Retire(ticks, "loop changed in the configuration");
            Volatile.Write(ref _loops, specs.ToDictionary(s => s.Id, s => change.Kept.Contains(s.Id) ? old[s.Id] : new LoopAlarms(s, this), StringComparer.Ordinal));
        }
    }

    /// <summary>Takes back stored states after a restart (see <see cref="LoopAlarms.Restore"/>); unknown loops are ignored.</summary>
    public void Restore(IEnumerable<AlarmStatus> stored)
    {
        foreach (var s in stored) if (_loops.TryGetValue(s.LoopId, out var l)) l.Restore(s);
    }

    /// <inheritdoc />
    public void Transitioned(in AlarmTransition transition)
    {
        lock (_recentGate)
        {
            _recent[_count % _recent.Length] = transition;
            _count++;
        }
        foreach (var s in _sinks) s.Transitioned(transition);
    }
}

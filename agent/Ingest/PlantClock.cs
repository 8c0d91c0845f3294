namespace LoopWatch.Agent.Ingest;

/// <summary>
/// Event time of the plant: the newest timestamp seen, carried forward by the wall clock times the replay speed
/// between messages. Used to notice stale loops in the same time the data speaks.
/// </summary>
public sealed class PlantClock(TimeProvider time, double speed = 1, double maxLeadSeconds = PlantClock.DefaultMaxLeadSeconds)
{
    /// <summary>Default of <c>Broker:MaxLeadSeconds</c>: how far a payload's timestamp may lie ahead of its receive time.</summary>
    public const double DefaultMaxLeadSeconds = 300;

    private readonly Lock _gate = new();
    private readonly long _originWallTicks = time.GetUtcNow().UtcTicks;
    private readonly long _maxLeadTicks = (long)(maxLeadSeconds * TimeSpan.TicksPerSecond);
    private long _eventTicks;
    private long _wallTicksAtEvent;

    /// <summary>How many simulated seconds pass per wall second (1 live, N for <c>demo --speed N</c>).</summary>
    public double Speed { get; } = speed;

    /// <summary>
    /// True when <paramref name="eventTicks"/> lies more than the allowed lead ahead of the receive time (the wall
    /// clock, run at <see cref="Speed"/> from the clock's creation for the demo): one such timestamp would otherwise
    /// hold a loop's sampling interval in the future and turn every later value late.
    /// </summary>
    public bool TooFarAhead(long eventTicks)
    {
        var wall = time.GetUtcNow().UtcTicks;
        var receive = _originWallTicks + (long)((wall - _originWallTicks) * Speed);
        return eventTicks - receive > _maxLeadTicks;
    }

    /// <summary>Notes an event time; only newer times move the clock.</summary>
    public void Observe(long eventTicks)
    {
        if (eventTicks <= Volatile.Read(ref _eventTicks)) return;
        lock (_gate)
        {
            if (eventTicks <= _eventTicks) return;
            _eventTicks = eventTicks;
            _wallTicksAtEvent = time.GetUtcNow().UtcTicks;
        }
    }

    /// <summary>The plant's time now (UTC ticks); the wall clock until the first event arrives.</summary>
    public long NowTicks
    {
        get
        {
            lock (_gate)
            {
                var wall = time.GetUtcNow().UtcTicks;
                if (_eventTicks == 0) return wall;
                return _eventTicks + (long)((wall - _wallTicksAtEvent) * Speed);
            }
        }
    }
}

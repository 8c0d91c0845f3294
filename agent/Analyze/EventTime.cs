namespace LoopWatch.Agent.Analyze;

/// <summary>A clock that reads the newest event time of the files being analysed, so offline analysis never sees the wall clock.</summary>
public sealed class EventTime : TimeProvider
{
    private long _ticks = DateTimeOffset.UnixEpoch.UtcTicks;

    /// <summary>Moves the clock to <paramref name="ticks"/> when that is later.</summary>
    public void MoveTo(long ticks)
    {
        if (ticks > _ticks) _ticks = ticks;
    }

    /// <inheritdoc />
    public override DateTimeOffset GetUtcNow() => new(_ticks, TimeSpan.Zero);
}

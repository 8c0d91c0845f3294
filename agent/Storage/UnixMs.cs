namespace LoopWatch.Agent.Storage;

/// <summary>Conversions between UTC ticks (the agent's event time) and unix milliseconds (the database's).</summary>
public static class UnixMs
{
    /// <summary>UTC ticks to unix ms.</summary>
    public static long FromTicks(long ticks) => (ticks - DateTimeOffset.UnixEpoch.UtcTicks) / TimeSpan.TicksPerMillisecond;

    /// <summary>Unix ms to UTC ticks.</summary>
    public static long ToTicks(long ms) => ms * TimeSpan.TicksPerMillisecond + DateTimeOffset.UnixEpoch.UtcTicks;
}

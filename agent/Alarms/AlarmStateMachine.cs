namespace LoopWatch.Agent.Alarms;

/// <summary>
/// The alarm state diagram as an explicit table (ISA-18.2 / IEC 62682, from memory): any pair not listed is refused.
/// Returns after shelving, suppression and out-of-service go to normal, and the condition is then evaluated afresh.
/// </summary>
public static class AlarmStateMachine
{
    /// <summary>Every allowed transition: from, trigger, to.</summary>
    public static IReadOnlyList<(AlarmState From, AlarmTrigger Trigger, AlarmState To)> Table { get; } =
    [
        (AlarmState.Normal, AlarmTrigger.Activate, AlarmState.Unacknowledged),
        (AlarmState.Unacknowledged, AlarmTrigger.Acknowledge, AlarmState.Acknowledged),
        (AlarmState.Unacknowledged, AlarmTrigger.Clear, AlarmState.ReturnedUnacknowledged),
        (AlarmState.Acknowledged, AlarmTrigger.Clear, AlarmState.Normal),
        (AlarmState.ReturnedUnacknowledged, AlarmTrigger.Acknowledge, AlarmState.Normal),
        (AlarmState.ReturnedUnacknowledged, AlarmTrigger.Activate, AlarmState.Unacknowledged),

        (AlarmState.Normal, AlarmTrigger.Shelve, AlarmState.Shelved),
        (AlarmState.Unacknowledged, AlarmTrigger.Shelve, AlarmState.Shelved),
        (AlarmState.Acknowledged, AlarmTrigger.Shelve, AlarmState.Shelved),
        (AlarmState.ReturnedUnacknowledged, AlarmTrigger.Shelve, AlarmState.Shelved),
        (AlarmState.Shelved, AlarmTrigger.Unshelve, AlarmState.Normal),

        (AlarmState.Normal, AlarmTrigger.Suppress, AlarmState.SuppressedByDesign),
        (AlarmState.Unacknowledged, AlarmTrigger.Suppress, AlarmState.SuppressedByDesign),
        (AlarmState.Acknowledged, AlarmTrigger.Suppress, AlarmState.SuppressedByDesign),
        (AlarmState.ReturnedUnacknowledged, AlarmTrigger.Suppress, AlarmState.SuppressedByDesign),
        (AlarmState.SuppressedByDesign, AlarmTrigger.Unsuppress, AlarmState.Normal),

        (AlarmState.Normal, AlarmTrigger.RemoveFromService, AlarmState.OutOfService),
        (AlarmState.Unacknowledged, AlarmTrigger.RemoveFromService, AlarmState.OutOfService),
        (AlarmState.Acknowledged, AlarmTrigger.RemoveFromService, AlarmState.OutOfService),
        (AlarmState.ReturnedUnacknowledged, AlarmTrigger.RemoveFromService, AlarmState.OutOfService),
        (AlarmState.Shelved, AlarmTrigger.RemoveFromService, AlarmState.OutOfService),
        (AlarmState.SuppressedByDesign, AlarmTrigger.RemoveFromService, AlarmState.OutOfService),
        (AlarmState.OutOfService, AlarmTrigger.ReturnToService, AlarmState.Normal),
    ];

    private const byte Refused = byte.MaxValue;
    private static readonly byte[,] Next = Build();

    /// <summary>The state after <paramref name="trigger"/> in <paramref name="from"/>; false (and <paramref name="to"/> = from) when the diagram forbids it.</summary>
    public static bool TryNext(AlarmState from, AlarmTrigger trigger, out AlarmState to)
    {
        var n = Next[(int)from, (int)trigger];
        to = n == Refused ? from : (AlarmState)n;
        return n != Refused;
    }

    private static byte[,] Build()
    {
        var next = new byte[Enum.GetValues<AlarmState>().Length, Enum.GetValues<AlarmTrigger>().Length];
        for (var s = 0; s < next.GetLength(0); s++)
            for (var t = 0; t < next.GetLength(1); t++) next[s, t] = Refused;
        foreach (var (from, trigger, to) in Table) next[(int)from, (int)trigger] = (byte)to;
        return next;
    }
}

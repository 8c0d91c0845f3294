namespace LoopWatch.Agent.Alarms;

/// <summary>The alarm states of the ISA-18.2 / IEC 62682 state model; <see cref="AlarmNames"/> gives their text.</summary>
public enum AlarmState : byte
{
    /// <summary>Condition clear, nothing to acknowledge.</summary>
    Normal,

    /// <summary>Condition active, not yet acknowledged.</summary>
    Unacknowledged,

    /// <summary>Condition active, acknowledged.</summary>
    Acknowledged,

    /// <summary>Condition cleared before anyone acknowledged it.</summary>
    ReturnedUnacknowledged,

    /// <summary>Taken out of annunciation by an operator for a limited time.</summary>
    Shelved,

    /// <summary>Held back by design logic (loop in manual, stale data, outside the operating window).</summary>
    SuppressedByDesign,

    /// <summary>Taken out of service (maintenance), until returned by a user.</summary>
    OutOfService,
}

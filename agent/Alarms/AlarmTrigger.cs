namespace LoopWatch.Agent.Alarms;

/// <summary>What moves an alarm from one state to another.</summary>
public enum AlarmTrigger : byte
{
    /// <summary>The finding has been active for the on-delay.</summary>
    Activate,

    /// <summary>The finding has been clear (beyond the deadband) for the off-delay.</summary>
    Clear,

    Acknowledge,
    Shelve,

    /// <summary>The shelf expired or a user took the alarm off the shelf.</summary>
    Unshelve,

    Suppress,
    Unsuppress,
    RemoveFromService,
    ReturnToService,
}

namespace LoopWatch.Agent.Alarms;

/// <summary>What became of a requested transition: accepted with its from/to states, or refused with the reason.</summary>
public readonly record struct AlarmActionResult(bool Accepted, AlarmState From, AlarmState To, string? Refusal)
{
    /// <summary>A refusal.</summary>
    public static AlarmActionResult Refuse(AlarmState state, string why) => new(false, state, state, why);
}

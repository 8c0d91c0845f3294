namespace LoopWatch.Agent.Alarms;

/// <summary>The text of states and triggers as they appear in the journal, the API and the health topic.</summary>
public static class AlarmNames
{
    private static readonly string[] States =
        ["normal", "unacknowledged", "acknowledged", "returned-unacknowledged", "shelved", "suppressed-by-design", "out-of-service"];

    private static readonly string[] Triggers =
        ["activate", "clear", "acknowledge", "shelve", "unshelve", "suppress", "unsuppress", "remove-from-service", "return-to-service"];

    /// <summary>The text of a state.</summary>
    public static string Of(AlarmState state) => States[(int)state];

    /// <summary>The text of a trigger.</summary>
    public static string Of(AlarmTrigger trigger) => Triggers[(int)trigger];

    /// <summary>The state a text names; false when unknown.</summary>
    public static bool TryState(string? text, out AlarmState state)
    {
        var i = Array.IndexOf(States, text);
        state = i < 0 ? AlarmState.Normal : (AlarmState)i;
        return i >= 0;
    }
}

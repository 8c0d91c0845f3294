namespace LoopWatch.Analytics.Oscillation;

/// <summary>The values of <see cref="OscillationFinding.CauseHint"/>.</summary>
public static class CauseHints
{
    /// <summary>OP-PV cross-correlation odd: a sticking valve is the likely cause.</summary>
    public const string Stiction = "stiction";

    /// <summary>OP-PV cross-correlation even: controller tuning or an oscillating disturbance from outside the loop.</summary>
    public const string TuningOrDisturbance = "tuning-or-disturbance";

    /// <summary>The test cannot tell (neither shape, or an integrating process).</summary>
    public const string Unknown = "unknown";
}

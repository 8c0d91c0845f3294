namespace LoopWatch.Analytics.Configuration;

/// <summary>One loop as written in the configuration file (<c>LoopWatch:Loops[n]</c>); bound, then checked by <see cref="LoopOptionsCheck"/>.</summary>
public sealed class LoopOptions
{
    public string? Id { get; set; }
    public string? Description { get; set; }
    public string? Area { get; set; }

    /// <summary><c>pid</c> or <c>on-off</c>.</summary>
    public string? Kind { get; set; }

    /// <summary><c>flow</c>, <c>level</c>, <c>pressure</c>, <c>temperature</c> or <c>other</c>; picks the defaults of <see cref="LimitOptions"/>.</summary>
    public string? Process { get; set; }

    public SignalOptions? Pv { get; set; }
    public SignalOptions? Sp { get; set; }
    public SignalOptions? Op { get; set; }
    public SignalOptions? Mode { get; set; }

    /// <summary>Optional valve position feedback, counted for reversals like the output.</summary>
    public SignalOptions? Position { get; set; }

    public LimitOptions? Limits { get; set; }
    public TuningOptions? Tuning { get; set; }

    /// <summary>Alarm delays, deadband, priorities and operating windows; see <see cref="AlarmOptions"/>.</summary>
    public AlarmOptions? Alarms { get; set; }
}

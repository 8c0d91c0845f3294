namespace LoopWatch.Analytics.Configuration;

/// <summary>A checked loop definition with defaults applied: what the detectors are built from.</summary>
public sealed record LoopSpec(
    string Id,
    string Description,
    string Area,
    LoopKind Kind,
    ProcessKind Process,
    string PvTag,
    double PvMin,
    double PvMax,
    string Unit,
    string? SpTag,
    string OpTag,
    string? ModeTag,
    string? PositionTag,
    LoopLimits Limits,
    LoopTuning Tuning)
{
    /// <summary>Alarm settings with defaults applied; defaults by process kind when not set.</summary>
    public LoopAlarmLimits Alarms { get; init; } = AlarmDefaults.For(Process);

    /// <summary>PV span in engineering units (Max - Min), always positive.</summary>
    public double Span => PvMax - PvMin;

    /// <summary>A value in engineering units as % of span.</summary>
    public double ToPct(double engineering) => (engineering - PvMin) / Span * 100.0;
}

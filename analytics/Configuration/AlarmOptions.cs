namespace LoopWatch.Analytics.Configuration;

/// <summary>
/// Alarm handling of one loop (<c>Loops[n]:Alarms</c>); every key is optional and defaults by process kind
/// (see <see cref="AlarmDefaults"/>).
/// </summary>
public sealed class AlarmOptions
{
    /// <summary>Deadband, % of the limit a figure must fall below before its alarm clears (default flow 5, level 5, pressure 2, temperature 1, other 2).</summary>
    public double? DeadbandPct { get; set; }

    /// <summary>A finding must stay active this long in event time before its alarm activates (default flow/pressure 15 s, level/temperature 60 s, other 30 s).</summary>
    public double? OnDelaySeconds { get; set; }

    /// <summary>A finding must stay ended this long before its alarm clears (same defaults as the on-delay).</summary>
    public double? OffDelaySeconds { get; set; }

    /// <summary>Priority per finding kind (<c>low</c>, <c>medium</c>, <c>high</c>), overriding <see cref="AlarmDefaults.Priority"/>.</summary>
    public Dictionary<string, string>? Priorities { get; set; }

    /// <summary>Windows of plant time (<c>"06:00-22:00"</c>, may cross midnight) in which alarms are live; none means always.</summary>
    public List<string>? ActiveWhen { get; set; }

    /// <summary>Time zone of <see cref="ActiveWhen"/> (IANA id); default UTC.</summary>
    public string? TimeZone { get; set; }
}

namespace LoopWatch.Analytics.Configuration;

/// <summary>One tag of a loop: the MQTT topic live, the tag name in CSV files; range and unit only on the PV.</summary>
public sealed class SignalOptions
{
    public string? Tag { get; set; }
    public double? Min { get; set; }
    public double? Max { get; set; }
    public string? Unit { get; set; }
}

namespace LoopWatch.Analytics.Configuration;

/// <summary>
/// Thresholds of the detectors; every key is optional and defaults by process kind (see <see cref="LimitDefaults"/>).
/// </summary>
public sealed class LimitOptions
{
    /// <summary>Sustained offset threshold, % of PV span.</summary>
    public double? OffsetPct { get; set; }

    /// <summary>How long the offset must last before it is a finding, seconds.</summary>
    public double? OffsetMinSeconds { get; set; }

    /// <summary>On-off loops: starts per hour above which the loop is short-cycling.</summary>
    public double? MaxStartsPerHour { get; set; }

    /// <summary>Final element: reversals per hour above which the element is hunting.</summary>
    public double? MaxReversalsPerHour { get; set; }

    /// <summary>Output moves smaller than this (% of stroke) are not counted as reversals or travel.</summary>
    public double? ReversalDeadbandPct { get; set; }

    /// <summary>Oscillation: IAE limit amplitude as % of span (Hagglund's a).</summary>
    public double? OscillationAmplitudePct { get; set; }

    /// <summary>Seconds without any update before the loop is stale.</summary>
    public double? StaleSeconds { get; set; }

    /// <summary>Nominal sampling interval of the tags, seconds.</summary>
    public double? SampleSeconds { get; set; }
}

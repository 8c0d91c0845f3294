namespace LoopWatch.Analytics.Monitoring;

/// <summary>
/// Rolling statistics of one loop over its analysis window; null where the figure does not apply to the loop kind
/// or there is not yet enough data. Names appear snake_case in JSON.
/// </summary>
public readonly record struct LoopStatistics
{
    // pid loops
    public double? MeanErrorPct { get; init; }
    public double? ErrorStdPct { get; init; }
    public double? ReversalsPerHour { get; init; }
    public double? TravelPctPerHour { get; init; }
    public double? SaturatedPct { get; init; }
    public double? TimeInAutoPct { get; init; }

    // on-off loops
    public double? CyclePeriodS { get; init; }
    public double? StartsPerHour { get; init; }
    public double? DutyPct { get; init; }
    public double? CycleAmplitudePct { get; init; }

    /// <summary>The advisers' figures (dead zone, offset what-if, performance index); null when no adviser applies.</summary>
    public Advice.LoopAdvice? Advice { get; init; }
}

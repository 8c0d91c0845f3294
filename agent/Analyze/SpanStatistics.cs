namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Whole-span figures of one loop over everything analysed (not the monitor's rolling windows); null where the figure
/// does not apply to the loop kind or there was no data for it. Names appear snake_case in JSON.
/// </summary>
public readonly record struct SpanStatistics
{
    public double Hours { get; init; }

    // pid loops
    public double? MeanErrorPct { get; init; }
    public double? ErrorStdPct { get; init; }
    public long? Reversals { get; init; }
    public double? ReversalsPerHour { get; init; }
    public double? TravelPct { get; init; }
    public double? TravelPctPerHour { get; init; }
    public double? SaturatedPct { get; init; }
    public double? TimeInAutoPct { get; init; }

    // on-off loops
    public long? Starts { get; init; }
    public double? StartsPerHour { get; init; }
    public double? CyclePeriodS { get; init; }
    public double? DutyPct { get; init; }
    public double? CycleAmplitudePct { get; init; }
}

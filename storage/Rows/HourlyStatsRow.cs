namespace LoopWatch.Storage.Rows;

/// <summary>
/// One loop's statistics for one clock hour starting at <see cref="HourMs"/> (unix ms, UTC); null where a figure does not
/// apply to the loop kind or had no data. Percentages are of span; seconds_* are time spent with that finding active.
/// </summary>
public readonly record struct HourlyStatsRow
{
    public required string LoopId { get; init; }
    public required long HourMs { get; init; }
    public long Samples { get; init; }
    public double? PvMean { get; init; }
    public double? PvMin { get; init; }
    public double? PvMax { get; init; }
    public double? SpMean { get; init; }
    public double? OpMean { get; init; }
    public double? OpMin { get; init; }
    public double? OpMax { get; init; }
    public double? MeanErrorPct { get; init; }
    public double? ErrorStdPct { get; init; }
    public long? Reversals { get; init; }
    public double? TravelPct { get; init; }
    public double? SaturatedPct { get; init; }
    public double? TimeInAutoPct { get; init; }
    public long? Starts { get; init; }
    public double? DutyPct { get; init; }
    public double? CyclePeriodS { get; init; }
    public double? CycleAmplitudePct { get; init; }
    public double? SecondsOscillating { get; init; }
    public double? SecondsOffset { get; init; }
    public double? SecondsShortCycling { get; init; }
    public double? SecondsReversals { get; init; }
    public double? SecondsAnyFinding { get; init; }
    public double? SecondsStale { get; init; }
    public double? SecondsManual { get; init; }
}

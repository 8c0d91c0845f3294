namespace LoopWatch.Analytics.OnOff;

/// <summary>
/// Figures of the recent on-off cycles: null until a cycle is complete. Trends compare the recent cycles with as many
/// before them (recent minus older) and are null until both are there.
/// </summary>
public readonly record struct CycleFigures(
    int Cycles,
    double? PeriodS,
    double? StartsPerHour,
    double? DutyPct,
    double? AmplitudePct,
    double? StartsPerHourTrend,
    double? AmplitudeTrendPct);

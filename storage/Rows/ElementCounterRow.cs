namespace LoopWatch.Storage.Rows;

/// <summary>
/// Cumulative counters of a final element (valve, pump, heater) since <see cref="PeriodStartMs"/>, the start of its
/// current service period. <see cref="RainflowJson"/> holds move-amplitude bins with their counts as JSON text.
/// </summary>
public readonly record struct ElementCounterRow(
    string LoopId,
    string Element,
    long PeriodStartMs,
    long Reversals,
    double TravelPct,
    string? RainflowJson,
    long UpdatedMs);

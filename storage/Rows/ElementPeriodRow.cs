namespace LoopWatch.Storage.Rows;

/// <summary>A closed service period of a final element with the counters it ended with.</summary>
public readonly record struct ElementPeriodRow(
    long Id,
    string LoopId,
    string Element,
    long StartMs,
    long EndMs,
    long Reversals,
    double TravelPct,
    string? RainflowJson,
    string ClosedBy,
    string? Note);

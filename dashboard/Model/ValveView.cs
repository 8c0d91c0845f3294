namespace LoopWatch.Dashboard.Model;

/// <summary>
/// One final element (a loop's output, or its valve position feedback): wear rates from the rolling hour, counters
/// since the last service, the rainflow histogram of move sizes and the projected days until the service threshold.
/// </summary>
public sealed record ValveView(
    string LoopId,
    string Element,
    string Description,
    string Area,
    double? ReversalsPerDay,
    double? TravelPctPerDay,
    long ReversalsSinceService,
    double TravelPctSinceService,
    DateTimeOffset? SinceService,
    IReadOnlyList<double> RainflowEdgesPct,
    IReadOnlyList<double> RainflowCounts,
    double? DaysToService,
    string? ServiceDue);

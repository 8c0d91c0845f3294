namespace LoopWatch.Analytics.Reversals;

/// <summary>
/// Lifetime counters of one final element (output or valve position) for storage to persist and seed back at start:
/// reversals, travel in % of stroke (100 % = one full stroke), and since when they count (UTC ticks, 0 = not yet).
/// </summary>
public readonly record struct ElementCounters(long Reversals, double TravelPct, long SinceTicks)
{
    /// <summary>Travel as full strokes.</summary>
    public double Strokes => TravelPct / 100.0;
}

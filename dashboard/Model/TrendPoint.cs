namespace LoopWatch.Dashboard.Model;

/// <summary>One bucket of a trend: mid-time (UTC ticks) and mean PV, SP (NaN when none) and OP.</summary>
public readonly record struct TrendPoint(long Ticks, float Pv, float Sp, float Op);

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// Whether an alarm whose finding has ended must stay active because its figure is still inside the deadband:
/// starts per hour, reversals per hour and |mean error| must fall below limit x (1 - deadband); the PV of an
/// out-of-range alarm must be back inside its range by deadband x span. Other kinds have no figure against a limit.
/// </summary>
public static class AlarmDeadband
{
    /// <summary>True while the figure of <paramref name="kind"/> has not yet fallen clear of the deadband.</summary>
    public static bool Holds(string kind, LoopSpec spec, Func<LoopStatistics>? statistics, double pv)
    {
        var band = spec.Alarms.DeadbandPct / 100.0;
        if (band <= 0) return false;
        switch (kind)
        {
            case FindingKinds.OutOfRange:
                return double.IsFinite(pv) && (pv < spec.PvMin + band * spec.Span || pv > spec.PvMax - band * spec.Span);
            case FindingKinds.ShortCycling:
                return Above(statistics?.Invoke().StartsPerHour, spec.Limits.MaxStartsPerHour, band);
            case FindingKinds.ExcessiveReversals:
                return Above(statistics?.Invoke().ReversalsPerHour, spec.Limits.MaxReversalsPerHour, band);
            case FindingKinds.SustainedOffset:
                return Above(statistics?.Invoke().MeanErrorPct is { } e ? Math.Abs(e) : null, spec.Limits.OffsetPct, band);
            default:
                return false;
        }
    }

    private static bool Above(double? figure, double limit, double band) => figure is { } f && f >= limit * (1 - band);
}

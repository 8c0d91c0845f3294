namespace LoopWatch.Analytics.OnOff;

/// <summary>One complete on-off cycle, start to next start (UTC ticks), with the PV extremes seen in it (% of span; NaN when no good PV).</summary>
public readonly record struct OnOffCycle(long StartTicks, long OnTicks, long PeriodTicks, double PvMinPct, double PvMaxPct)
{
    /// <summary>Half the PV peak-to-peak over the cycle, % of span.</summary>
    public double AmplitudePct => (PvMaxPct - PvMinPct) / 2;

    /// <summary>Share of the cycle the element was on, %.</summary>
    public double DutyPct => PeriodTicks > 0 ? 100.0 * OnTicks / PeriodTicks : double.NaN;
}

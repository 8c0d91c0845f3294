namespace LoopWatch.Analytics.ProportionalBand;

/// <summary>A steady period: means of PV and SP (% of span) and OP (%) over its blocks, in manual or not, and when it ran (UTC ticks).</summary>
public readonly record struct SteadyLevel(int Blocks, double PvPct, double SpPct, double OpPct, bool Manual, long StartTicks, long EndTicks)
{
    /// <summary>The error SP - PV, % of span.</summary>
    public double ErrorPct => SpPct - PvPct;

    /// <summary>This level with one more block of the given means, ending at <paramref name="endTicks"/>.</summary>
    public SteadyLevel Extend(double pv, double sp, double op, long endTicks) =>
        new(Blocks + 1, PvPct + (pv - PvPct) / (Blocks + 1), SpPct + (sp - SpPct) / (Blocks + 1), OpPct + (op - OpPct) / (Blocks + 1), Manual, StartTicks, endTicks);
}

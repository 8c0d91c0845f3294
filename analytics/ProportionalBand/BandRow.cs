namespace LoopWatch.Analytics.ProportionalBand;

/// <summary>
/// One line of the what-if table: a proportional band (%), its gain 100 / PB, the offset it would leave (% of span,
/// signed as SP - PV), and, when the ultimate gain is known, the gain margin Ku / Kc (below 1 the loop oscillates).
/// </summary>
public sealed record BandRow(double PbPct, double Kc, double OffsetPct, double? GainMargin, bool Current)
{
    /// <summary>True when the gain is at or beyond the ultimate gain.</summary>
    public bool Oscillates => GainMargin is < 1;
}

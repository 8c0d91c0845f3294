using LoopWatch.Analytics.Advice;
using static LoopWatch.Analytics.Advice.Rounding;

namespace LoopWatch.Analytics.ProportionalBand;

/// <summary>
/// Offset what-if of a proportional-only loop: the process gain Kp from steady periods either side of a set-point
/// change or manual output step (delta PV / delta OP, % of span per %), the offset now, the load effect
/// offset × (1 + Kc Kp), and per band the offset load / (1 + Kc Kp); with dead time and time constant, the gain at
/// which the loop would oscillate. Figures rounded to 4 significant digits, each computed from the rounded ones before it.
/// </summary>
public sealed record ProportionalBandAdvice(
    DateTimeOffset? At,
    string? NotShownBecause,
    double? PbPct = null,
    double? Kc = null,
    double ProcessGain = 0,
    int GainPairs = 0,
    double PairSpChangePct = 0,
    double PairPvChangePct = 0,
    double PairOpChangePct = 0,
    bool PairInManual = false,
    double OffsetPct = 0,
    double LoadEffectPct = 0,
    double? DeadTimeSeconds = null,
    double? TimeConstantSeconds = null,
    double? UltimateOmega = null,
    double? UltimatePeriodS = null,
    double? UltimateKc = null,
    double? UltimatePbPct = null,
    IReadOnlyList<BandRow>? Rows = null,
    IReadOnlyList<double>? PairGains = null) : AdviserResult(At, NotShownBecause)
{
    /// <inheritdoc />
    public override string Adviser => "offset-what-if";

    /// <inheritdoc />
    public override string Title => "Offset what-if (proportional-only)";

    /// <inheritdoc />
    public override string Headline => Shown
        ? $"offset {Text(OffsetPct)} % of span at PB {Text(PbPct ?? 0)} %; " +
          string.Join(", ", (Rows ?? []).Where(r => !r.Current).Select(r => $"PB {Text(r.PbPct)} % would leave {Text(r.OffsetPct)} %{(r.Oscillates ? " (oscillates)" : "")}")) +
          "; only integral action removes it"
        : $"offset what-if not shown: {NotShownBecause}";

    /// <inheritdoc />
    public override IReadOnlyList<string> Explanation => Shown
        ? [
            $"Process gain: {(PairInManual ? "in manual the output was stepped" : $"the set point moved {Text(PairSpChangePct)} % of span")} between two steady periods; " +
            $"the PV moved {Text(PairPvChangePct)} % of span and the output {Text(PairOpChangePct)} %, so Kp = {Text(PairPvChangePct)} / {Text(PairOpChangePct)} = {Text(Significant(PairPvChangePct / PairOpChangePct))}" +
            (GainPairs > 1 ? $"; the median of the last {GainPairs} such pairs ({string.Join(", ", (PairGains ?? []).Select(Text))}) is Kp = {Text(ProcessGain)}." : "."),
            $"Now: PB {Text(PbPct ?? 0)} %, so Kc = 100 / PB = {Text(Kc ?? 0)}; over the current steady period the offset SP - PV is {Text(OffsetPct)} % of span.",
            $"Load effect (the offset with no proportional action) = offset × (1 + Kc Kp) = {Text(OffsetPct)} × (1 + {Text(Kc ?? 0)} × {Text(ProcessGain)}) = {Text(LoadEffectPct)} % of span; " +
            $"any band leaves offset = {Text(LoadEffectPct)} / (1 + Kc × {Text(ProcessGain)}) with Kc = 100 / PB (Seborg, Edgar and Mellichamp: offset = K_L M / (1 + Kc Kp)).",
            UltimateKc is { } ku
                ? $"With dead time {Text(DeadTimeSeconds ?? 0)} s and time constant {Text(TimeConstantSeconds ?? 0)} s (first order plus dead time), the phase reaches -180° where " +
                  $"{Text(DeadTimeSeconds ?? 0)} w + atan({Text(TimeConstantSeconds ?? 0)} w) = pi: w = {Text(UltimateOmega ?? 0)} rad/s (period {Text(UltimatePeriodS ?? 0)} s); " +
                  $"the loop oscillates from Kc = sqrt(1 + ({Text(TimeConstantSeconds ?? 0)} w)²) / Kp = {Text(ku)}, PB = {Text(UltimatePbPct ?? 0)} % (Bode stability criterion); the table's margin is {Text(ku)} / Kc."
                : "Tuning:DeadTimeSeconds and Tuning:TimeConstantSeconds are not both configured, so the band at which the loop would start to oscillate is not estimated.",
            "Only integral action removes the offset; a narrower band (higher gain) leaves a smaller offset but less stability margin.",
          ]
        : [$"The offset what-if is not shown: {NotShownBecause}."];
}

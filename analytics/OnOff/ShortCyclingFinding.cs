using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.OnOff;

/// <summary>An on-off loop starting its final element more often than <see cref="MaxStartsPerHour"/>.</summary>
public sealed record ShortCyclingFinding(
    DateTimeOffset Start,
    DateTimeOffset? End,
    double StartsPerHour,
    double CyclePeriodS,
    double DutyPct,
    double CycleAmplitudePct,
    double MaxStartsPerHour)
    : Finding(FindingKinds.ShortCycling, Start, End)
{
    public override string Diagnosis =>
        $"{StartsPerHour:0.#} starts an hour (limit {MaxStartsPerHour:0.#}), one cycle every {CyclePeriodS:0} s at {DutyPct:0} % duty, " +
        $"PV swinging ±{CycleAmplitudePct:0.#} % of span: the dead zone between the switching levels is likely too narrow, " +
        "which means more starts and more wear; widen the dead zone and check the transmitter for noise near the switching points.";
}

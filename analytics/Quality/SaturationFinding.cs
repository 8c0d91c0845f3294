using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Quality;

/// <summary>The output sat at a limit (<see cref="Limit"/> <c>high</c> or <c>low</c>) for <see cref="SaturatedPct"/> of the last <see cref="WindowMinutes"/> in auto.</summary>
public sealed record SaturationFinding(DateTimeOffset Start, DateTimeOffset? End, double SaturatedPct, string Limit, double WindowMinutes)
    : Finding(FindingKinds.Saturation, Start, End)
{
    public override string Diagnosis => Limit == "high"
        ? $"Output at its high limit {SaturatedPct:0} % of the last {WindowMinutes:0} minutes in auto: the controller has run out of valve; check for a blocked line, a closed hand valve, an undersized valve or a set point beyond reach."
        : $"Output at its low limit {SaturatedPct:0} % of the last {WindowMinutes:0} minutes in auto: the process gives more than needed with the valve shut; check for a passing valve, a bypass or a set point below what the process settles at.";
}

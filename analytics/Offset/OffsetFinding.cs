using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Offset;

/// <summary>
/// SP - PV stayed beyond Limits:OffsetPct in auto: <see cref="OffsetPct"/> is the smoothed mean error (signed, % of span),
/// <see cref="DurationS"/> how long it has lasted, <see cref="SaturatedPct"/> the share of that time the output sat at a limit.
/// </summary>
public sealed record OffsetFinding(
    DateTimeOffset Start,
    DateTimeOffset? End,
    double OffsetPct,
    double DurationS,
    double SaturatedPct,
    string Cause) : Finding(FindingKinds.SustainedOffset, Start, End)
{
    public override string Diagnosis => Cause == OffsetCauses.OutputSaturated
        ? $"PV has stayed {Side} SP by {Math.Abs(OffsetPct):0.0} % of span for {DurationS / 60:0} min with the output at its limit: " +
          "final element out of range, an actuator or capacity problem. Check valve travel and size, pump or supply capacity."
        : $"PV has stayed {Side} SP by {Math.Abs(OffsetPct):0.0} % of span for {DurationS / 60:0} min with the output free to move: " +
          "no or weak integral action, as with proportional-only control. Check that integral action is configured and Ti is not too long.";

    private string Side => OffsetPct > 0 ? "below" : "above";
}

using LoopWatch.Analytics.Advice;
using static LoopWatch.Analytics.Advice.Rounding;

namespace LoopWatch.Analytics.DeadZone;

/// <summary>
/// Dead-zone sizing of an on-off loop from its measured cycles: PV rates while off and on (unit per minute, signed),
/// the switching points and dead zone now, the cycle time and starts per hour a dead zone gives
/// (T = D / |rate off| + D / |rate on|), the narrowest dead zone within <see cref="MaxStartsPerHour"/> and the swing it
/// costs. Every figure is rounded to 4 significant digits and each is computed from the rounded ones before it.
/// </summary>
public sealed record DeadZoneAdvice(
    DateTimeOffset? At,
    string? NotShownBecause,
    string Unit,
    double MaxStartsPerHour,
    int Halves = 0,
    double RateOffPerMin = 0,
    double RateOnPerMin = 0,
    double PvAtStart = 0,
    double PvAtStop = 0,
    double DeadZone = 0,
    double CycleMin = 0,
    double StartsPerHour = 0,
    double? MeasuredStartsPerHour = null,
    double TargetCycleMin = 0,
    double NarrowestDeadZone = 0,
    double SwingPctOfSpan = 0,
    double? WorstInflowDeadZone = null) : AdviserResult(At, NotShownBecause)
{
    /// <inheritdoc />
    public override string Adviser => "dead-zone";

    /// <inheritdoc />
    public override string Title => "Dead-zone sizing";

    /// <inheritdoc />
    public override string Headline => Shown
        ? $"dead zone {Text(DeadZone)} {Unit} gives {Text(StartsPerHour)} starts/h; at least {Text(NarrowestDeadZone)} {Unit} keeps within {Text(MaxStartsPerHour)} starts/h"
        : $"dead-zone sizing not shown: {NotShownBecause}";

    /// <inheritdoc />
    public override IReadOnlyList<string> Explanation => Shown
        ? [
            $"While off the PV {Way(RateOffPerMin)} at {Text(Math.Abs(RateOffPerMin))} {Unit}/min, while on it {Way(RateOnPerMin)} at {Text(Math.Abs(RateOnPerMin))} {Unit}/min " +
            $"(medians of the least-squares slopes of the last {Halves} off and on periods).",
            $"The element switches on at {Text(PvAtStart)} {Unit} and off at {Text(PvAtStop)} {Unit} (medians of where each period's fitted line stands half a sample before the switching edge), so the dead zone now is D = {Text(DeadZone)} {Unit}.",
            $"Cycle time T = D / {Text(Math.Abs(RateOffPerMin))} + D / {Text(Math.Abs(RateOnPerMin))} = {Text(CycleMin)} min, so 60 / T = {Text(StartsPerHour)} starts/h" +
            (MeasuredStartsPerHour is { } m ? $" (measured from the cycles: {Text(m)} starts/h)." : "."),
            $"For at most {Text(MaxStartsPerHour)} starts/h a cycle must last 60 / {Text(MaxStartsPerHour)} = {Text(TargetCycleMin)} min: " +
            $"D = {Text(TargetCycleMin)} / (1 / {Text(Math.Abs(RateOffPerMin))} + 1 / {Text(Math.Abs(RateOnPerMin))}) = {Text(NarrowestDeadZone)} {Unit}, " +
            $"so the PV swings over {Text(NarrowestDeadZone)} {Unit} ({Text(SwingPctOfSpan)} % of span) instead of {Text(DeadZone)} {Unit}.",
            .. WorstInflowDeadZone is { } w
                ? [$"If the inflow rises to half the pump rate (the shortest cycle of the wet-well rule, 4V/Qp), the cycle is 4D / ({Text(Math.Abs(RateOffPerMin))} + {Text(Math.Abs(RateOnPerMin))}), " +
                   $"so D = {Text(TargetCycleMin)} × ({Text(Math.Abs(RateOffPerMin))} + {Text(Math.Abs(RateOnPerMin))}) / 4 = {Text(w)} {Unit} keeps within the limit at any inflow."]
                : (string[])[],
            "This assumes the PV moves at a steady rate between the switching points, as a level does; for a self-regulating process such as a heater it is a first estimate.",
          ]
        : [$"Dead-zone sizing is not shown: {NotShownBecause}."];

    private static string Way(double rate) => rate >= 0 ? "rises" : "falls";
}

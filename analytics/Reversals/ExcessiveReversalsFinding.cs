using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Reversals;

/// <summary>The controller output reverses more often than <see cref="MaxReversalsPerHour"/>; position figures when the loop has a position tag.</summary>
public sealed record ExcessiveReversalsFinding(
    DateTimeOffset Start,
    DateTimeOffset? End,
    double ReversalsPerHour,
    double TravelPctPerHour,
    double MaxReversalsPerHour,
    double? PositionReversalsPerHour = null,
    double? PositionTravelPctPerHour = null)
    : Finding(FindingKinds.ExcessiveReversals, Start, End)
{
    public override string Diagnosis =>
        $"Output hunts with {ReversalsPerHour / 60:0.#} reversals a minute ({ReversalsPerHour:0} an hour, limit {MaxReversalsPerHour:0}) " +
        $"and {TravelPctPerHour:0} % of stroke travel an hour; check measurement noise and filtering, derivative action and the valve positioner.";
}

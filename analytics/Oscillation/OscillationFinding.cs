using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// The loop oscillates in auto: <see cref="PeriodS"/>, <see cref="AmplitudePct"/> (half peak-to-peak of the error,
/// % of span), Thornhill's <see cref="Regularity"/> (null before the ACF has been evaluated), the cause hint from the
/// OP-PV cross-correlation (<see cref="CauseHints"/>), and which method saw it (<c>acf-regularity</c>, <c>iae-count</c> or both).
/// </summary>
public sealed record OscillationFinding(
    DateTimeOffset Start,
    DateTimeOffset? End,
    double PeriodS,
    double AmplitudePct,
    double? Regularity,
    string CauseHint,
    string Method) : Finding(FindingKinds.Oscillation, Start, End)
{
    public override string Diagnosis => CauseHint switch
    {
        CauseHints.Stiction =>
            $"Oscillating with period {PeriodS:0} s, amplitude {AmplitudePct:0.0} % of span; output and PV look like a " +
            "sticking valve. Put the loop in manual and step the output in small moves to test for stiction; check the positioner.",
        CauseHints.TuningOrDisturbance =>
            $"Oscillating with period {PeriodS:0} s, amplitude {AmplitudePct:0.0} % of span; output and PV look like tight " +
            "tuning or a disturbance from outside. Look for an upstream loop with the same period; if none, reduce the gain or increase the integral time.",
        _ =>
            $"Oscillating with period {PeriodS:0} s, amplitude {AmplitudePct:0.0} % of span; cause not clear from the data. " +
            "Test the valve for stiction in manual, then look for an upstream disturbance with the same period, then the tuning.",
    };
}

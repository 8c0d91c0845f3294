using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Quality;

/// <summary>The PV stayed at <see cref="Pv"/> for <see cref="Samples"/> samples while the output moved <see cref="OpMovePct"/> %.</summary>
public sealed record FrozenFinding(DateTimeOffset Start, DateTimeOffset? End, double Pv, long Samples, double OpMovePct)
    : Finding(FindingKinds.Frozen, Start, End)
{
    public override string Diagnosis =>
        $"PV has stayed at {Pv:G5} for {Samples} samples while the output moved {OpMovePct:0.#} %: the transmitter may be stuck or isolated, " +
        "or a gateway is repeating its last value; check the transmitter and the data path.";
}

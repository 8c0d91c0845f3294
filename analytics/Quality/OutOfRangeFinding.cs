using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Quality;

/// <summary>The PV read <see cref="Pv"/>, outside its configured range <see cref="Min"/>..<see cref="Max"/>.</summary>
public sealed record OutOfRangeFinding(DateTimeOffset Start, DateTimeOffset? End, double Pv, double Min, double Max, string Unit)
    : Finding(FindingKinds.OutOfRange, Start, End)
{
    public override string Diagnosis
    {
        get
        {
            var u = Unit.Length > 0 ? " " + Unit : "";
            return $"PV reads {Pv:G5}{u}, outside its range {Min:G5}..{Max:G5}{u}: check the transmitter, its wiring " +
                "(a broken loop often reads below range) and the range configured here against the transmitter's.";
        }
    }
}

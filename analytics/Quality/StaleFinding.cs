using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Quality;

/// <summary>No value from any of the loop's tags for longer than <see cref="AfterSeconds"/>.</summary>
public sealed record StaleFinding(DateTimeOffset Start, DateTimeOffset? End, double AfterSeconds)
    : Finding(FindingKinds.Stale, Start, End)
{
    public override string Diagnosis =>
        $"No data for more than {AfterSeconds:0} s; check the tag path, the gateway and the broker connection.";
}

using LoopWatch.Analytics.Findings;

namespace LoopWatch.Analytics.Quality;

/// <summary>
/// A stale loop whose data source said it went offline (a Sparkplug death certificate), so the loop is stale at once
/// rather than after its stale time; <see cref="Source"/> names the node or device.
/// </summary>
public sealed record SourceOfflineFinding(DateTimeOffset Start, DateTimeOffset? End, string Source)
    : Finding(FindingKinds.Stale, Start, End)
{
    public override string Diagnosis =>
        $"The data source {Source} reported itself offline; the loop's values are not current. Check the edge node or device and its link to the broker.";
}

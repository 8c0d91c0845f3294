namespace LoopWatch.Analytics.Findings;

/// <summary>The finding kinds, as they appear in every output.</summary>
public static class FindingKinds
{
    public const string SustainedOffset = "sustained-offset";
    public const string ShortCycling = "short-cycling";
    public const string Oscillation = "oscillation";
    public const string ExcessiveReversals = "excessive-reversals";
    public const string Saturation = "saturation";
    public const string Stale = "stale";
    public const string Frozen = "frozen";
    public const string OutOfRange = "out-of-range";

    /// <summary>All kinds, in the order reports list them.</summary>
    public static IReadOnlyList<string> All { get; } =
        [Stale, OutOfRange, Frozen, Oscillation, ShortCycling, ExcessiveReversals, SustainedOffset, Saturation];
}

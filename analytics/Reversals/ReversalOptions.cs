namespace LoopWatch.Analytics.Reversals;

/// <summary>
/// Settings of the reversal counting; the deadband and the limit come from the loop's limits. Defaults: rates over
/// the last 60 minutes in one-minute buckets, judged once 10 minutes of data are in; the finding ends below 90 % of the
/// limit; rainflow residue of 64 turning points.
/// </summary>
public sealed record ReversalOptions
{
    /// <summary>Length of the rate window, minutes.</summary>
    public int WindowMinutes { get; init; } = 60;

    /// <summary>Minutes of data before excessive reversals may be raised.</summary>
    public int MinWindowMinutes { get; init; } = 10;

    /// <summary>The finding ends when reversals per hour fall below this fraction of the limit.</summary>
    public double ClearFraction { get; init; } = 0.9;

    /// <summary>Turning points the rainflow residue holds.</summary>
    public int ResidueCapacity { get; init; } = 64;
}

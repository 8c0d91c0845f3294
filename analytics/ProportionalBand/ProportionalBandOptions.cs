namespace LoopWatch.Analytics.ProportionalBand;

/// <summary>
/// Settings of the offset what-if of proportional-only loops. Defaults (our choice, common practice, no source): blocks
/// of 60 s; a block is steady when the PV's standard deviation in it is at most 0.5 % of span, and two blocks make a
/// steady period when their PV means differ by at most 0.25 % of span, OP means by 0.5 % and SP means by 0.25 %; a
/// pair of steady periods measures the process gain when the output moved at least 1 % and, in auto, the set point at
/// least 0.5 % of span; the median of the last 5 such pairs; bands at 2, 1, 1/2, 1/4 and 1/10 of the current one.
/// </summary>
public sealed record ProportionalBandOptions
{
    public double BlockSeconds { get; init; } = 60;
    public double SteadyStdPct { get; init; } = 0.5;
    public double PvDriftPct { get; init; } = 0.25;
    public double OpDriftPct { get; init; } = 0.5;
    public double MinOpStepPct { get; init; } = 1;
    public double MinSpStepPct { get; init; } = 0.5;
    public int Pairs { get; init; } = 5;

    /// <summary>The bands of the table, as multiples of the current band.</summary>
    public IReadOnlyList<double> BandFactors { get; init; } = [2, 1, 0.5, 0.25, 0.1];
}

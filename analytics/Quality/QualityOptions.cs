namespace LoopWatch.Analytics.Quality;

/// <summary>
/// Settings of the saturation and data-quality detectors. Defaults: the output is saturated at or below 0.5 % or at or
/// above 99.5 %; <c>saturation</c> is raised when saturated in auto for more than 50 % of the last 10 minutes and ends
/// below 40 %; statistics over the last 60 minutes. <c>frozen</c>: PV within 0.01 % of span of where it stood for 120
/// samples while the output moved more than 5 %. <c>out-of-range</c>: PV more than 1 % of span outside Min..Max for 5
/// samples in a row, ended by 5 samples back inside. Thresholds are common practice as chosen by the team, no source.
/// </summary>
public sealed record QualityOptions
{
    public double SaturationLowPct { get; init; } = 0.5;
    public double SaturationHighPct { get; init; } = 99.5;
    public int SaturationWindowMinutes { get; init; } = 10;
    public double SaturationRaisePct { get; init; } = 50;
    public double SaturationClearPct { get; init; } = 40;

    /// <summary>Minutes over which <c>SaturatedPct</c> and <c>TimeInAutoPct</c> are figured.</summary>
    public int StatisticsWindowMinutes { get; init; } = 60;

    public int FrozenSamples { get; init; } = 120;
    public double FrozenTolerancePct { get; init; } = 0.01;
    public double FrozenOpMovePct { get; init; } = 5;

    public double OutOfRangeTolerancePct { get; init; } = 1;
    public int OutOfRangeSamples { get; init; } = 5;
}

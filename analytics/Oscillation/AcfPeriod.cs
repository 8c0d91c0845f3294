namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// What the autocorrelation of a window says: period in samples, Thornhill's regularity r, the ACF peak near one period
/// and how many ACF zero crossings were used; NaN figures when too few crossings were found.
/// </summary>
public readonly record struct AcfPeriod(double PeriodSamples, double Regularity, double Peak, int ZeroCrossings)
{
    /// <summary>Nothing measurable (no energy or too few zero crossings).</summary>
    public static AcfPeriod None => new(double.NaN, double.NaN, double.NaN, 0);
}

namespace LoopWatch.Analytics.Statistics;

/// <summary>Count, mean and sample variance (n - 1 divisor) of a series; variance and deviation are NaN below two values.</summary>
public readonly record struct Moments(long Count, double Mean, double Variance, double StdDev)
{
    /// <summary>No values.</summary>
    public static Moments Empty { get; } = new(0, double.NaN, double.NaN, double.NaN);
}

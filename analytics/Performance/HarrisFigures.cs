namespace LoopWatch.Analytics.Performance;

/// <summary>
/// One Harris evaluation: window length and AR order, error variance sigma_y^2, innovation variance sigma_a^2 of the AR
/// fit, minimum variance sigma_mv^2 = sigma_a^2 (psi_0^2 + ... + psi_(b-1)^2) and the index 1 - sigma_mv^2 / sigma_y^2.
/// </summary>
public readonly record struct HarrisFigures(int Samples, int Order, int Delay, double ErrorVariance, double InnovationVariance,
    double MinimumVariance, double Index);

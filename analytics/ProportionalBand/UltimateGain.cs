namespace LoopWatch.Analytics.ProportionalBand;

/// <summary>
/// The gain at which a proportional loop on a first-order-plus-dead-time process Kp e^(-theta s) / (tau s + 1) starts to
/// oscillate: the phase crossover theta w + atan(tau w) = pi, where |Kc G| = 1 gives Ku = sqrt(1 + (tau w)^2) / Kp
/// (Bode stability criterion, as in Seborg, Edgar and Mellichamp, Process Dynamics and Control; from memory).
/// </summary>
public static class UltimateGain
{
    /// <summary>Ultimate gain and frequency (rad/s) for process gain <paramref name="kp"/>, time constant <paramref name="tau"/> s and dead time <paramref name="theta"/> s.</summary>
    public static (double Ku, double OmegaU) Of(double kp, double tau, double theta)
    {
        if (!(kp != 0 && tau > 0 && theta > 0)) throw new ArgumentOutOfRangeException(nameof(kp), "Kp must be non-zero, tau and theta positive");
        // The phase lag theta w + atan(tau w) rises monotonically from 0; bisection on [0, pi / theta] where it passes pi.
        double lo = 0, hi = Math.PI / theta;
        for (var i = 0; i < 200 && hi - lo > 1e-15 * hi; i++)
        {
            var mid = (lo + hi) / 2;
            if (theta * mid + Math.Atan(tau * mid) < Math.PI) lo = mid;
            else hi = mid;
        }
        var w = (lo + hi) / 2;
        return (Math.Sqrt(1 + tau * tau * w * w) / Math.Abs(kp), w);
    }
}

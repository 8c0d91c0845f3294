namespace LoopWatch.Agent.Plant;

/// <summary>
/// A self-regulating process G(s) = K e^(-Ls) / (Ts + 1), stepped exactly for a held input (zero-order hold);
/// the dead time is a delay line of whole steps.
/// </summary>
public sealed class FirstOrderDeadTime
{
    private readonly double _a, _gain;
    private readonly double[] _delay;
    private int _head;

    /// <summary>A process of gain <paramref name="gain"/>, time constant <paramref name="tau"/> s and dead time <paramref name="deadTime"/> s, stepped every <paramref name="dt"/> s.</summary>
    public FirstOrderDeadTime(double gain, double tau, double deadTime, double dt, double initialOutput = 0, double initialInput = 0)
    {
        if (tau <= 0 || dt <= 0 || deadTime < 0) throw new ArgumentOutOfRangeException(nameof(tau), "tau and dt must be positive, dead time not negative");
        _gain = gain;
        _a = Math.Exp(-dt / tau);
        _delay = new double[Math.Max(1, (int)Math.Round(deadTime / dt))];
        Array.Fill(_delay, initialInput);
        Output = initialOutput;
    }

    /// <summary>The process output now.</summary>
    public double Output { get; private set; }

    /// <summary>Advances one step with input <paramref name="input"/> held over it; returns the new output.</summary>
    public double Step(double input)
    {
        // The input entering now leaves the delay line L later; a delay of zero still costs one sample (sampled system).
        var delayed = _delay[_head];
        _delay[_head] = input;
        _head = (_head + 1) % _delay.Length;
        Output = _a * Output + _gain * (1 - _a) * delayed;
        return Output;
    }
}

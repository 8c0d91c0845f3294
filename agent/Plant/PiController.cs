namespace LoopWatch.Agent.Plant;

/// <summary>
/// A positional PI controller on values in % of span: OP = bias + Kc (e + (1/Ti) integral e dt), clamped to 0-100 %
/// with conditional integration against windup. Without Ti it is proportional-only, as with a manual-reset bias.
/// </summary>
public sealed class PiController(double kc, double? tiSeconds, double bias, bool reverseActing = true)
{
    private double _integral;

    /// <summary>Controller gain (% output per % error); proportional band is 100 / Kc.</summary>
    public double Kc { get; set; } = kc;

    /// <summary>Integral time in seconds; null for proportional-only.</summary>
    public double? TiSeconds { get; set; } = tiSeconds;

    /// <summary>Output when the error is zero and the integral empty (manual reset).</summary>
    public double Bias { get; set; } = bias;

    /// <summary>The last output, %.</summary>
    public double Output { get; private set; } = bias;

    /// <summary>One controller execution; <paramref name="sp"/> and <paramref name="pv"/> in % of span.</summary>
    public double Step(double sp, double pv, double dt)
    {
        // Reverse acting: output rises when PV falls below SP (most valve loops).
        var e = reverseActing ? sp - pv : pv - sp;
        var candidate = _integral + (TiSeconds is { } ti ? Kc * e * dt / ti : 0);
        var raw = Bias + Kc * e + candidate;
        var output = Math.Clamp(raw, 0, 100);
        if (raw == output || Math.Sign(e) != Math.Sign(raw - output)) _integral = candidate;
        Output = output;
        return output;
    }

    /// <summary>Bumpless return to auto: the integral takes up whatever the output was while in manual.</summary>
    public void Track(double sp, double pv, double output)
    {
        var e = reverseActing ? sp - pv : pv - sp;
        _integral = TiSeconds is null ? 0 : output - Bias - Kc * e;
        Output = output;
    }
}

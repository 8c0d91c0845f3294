namespace LoopWatch.Agent.Plant;

/// <summary>
/// Settings of a simulated continuous loop, in % of PV span and seconds. A first-order-plus-dead-time process unless
/// <see cref="IntegratingAreaPctPerPctS"/> is set (then an integrating level whose rate is that many % per % of net inflow per second).
/// </summary>
public sealed record PidLoopSetup
{
    public double Dt { get; init; } = 1;
    public double SetPointPct { get; init; } = 50;
    public double InitialOpPct { get; init; } = 50;
    public double Kc { get; init; } = 1;
    public double? TiSeconds { get; init; } = 30;
    public double ProcessGain { get; init; } = 1;
    public double TauSeconds { get; init; } = 10;
    public double DeadTimeSeconds { get; init; } = 1;
    public double? IntegratingAreaPctPerPctS { get; init; }
    public double? StictionS { get; init; }
    public double StictionJ { get; init; }
    public double NoiseSigmaPct { get; init; }
    public double NoiseFilterSeconds { get; init; }
    /// <summary>Unmeasured disturbance at the process input: first-order filtered noise of this sigma, % of output.</summary>
    public double InputNoiseSigmaPct { get; init; }
    public double InputNoiseFilterSeconds { get; init; } = 50;
    public double LoadAmplitudePct { get; init; }
    public double LoadMeanGapSeconds { get; init; } = 600;
    public double LoadMeanHoldSeconds { get; init; } = 300;
    public (double At, double LoadPct)[]? LoadSteps { get; init; }
    /// <summary>Set-point changes: from each time (s) the set point is that % of span.</summary>
    public (double At, double SetPointPct)[]? SetPointSteps { get; init; }
    public (double Start, double End)[]? ManualPeriods { get; init; }
    public int Seed { get; init; } = 1;
}

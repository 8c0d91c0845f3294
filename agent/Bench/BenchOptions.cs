namespace LoopWatch.Agent.Bench;

/// <summary>
/// What <c>loopwatch bench</c> runs: <see cref="Loops"/> simulated loops of three tags, at a fixed offered
/// <see cref="Rate"/> (updates per second) or flat out when null, for <see cref="Seconds"/>; through MQTT (the embedded
/// broker, or <see cref="BrokerHost"/>:<see cref="BrokerPort"/>) or, with <see cref="InProcess"/>, the analytics and
/// alarm path alone.
/// </summary>
public sealed record BenchOptions(int Loops, double? Rate, double Seconds, bool InProcess, string? BrokerHost, int BrokerPort)
{
    /// <summary>Tags per simulated loop: PV, SP and OP.</summary>
    public const int TagsPerLoop = 3;
}

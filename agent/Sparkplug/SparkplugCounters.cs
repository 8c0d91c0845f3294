namespace LoopWatch.Agent.Sparkplug;

/// <summary>What the Sparkplug reader has seen since start; shown on <c>/api/sparkplug</c>.</summary>
public readonly record struct SparkplugCounters(
    long Messages,
    long Births,
    long Deaths,
    long OldDeaths,
    long SequenceGaps,
    long UnknownAliases,
    long DataBeforeBirth,
    long Malformed,
    long Historical,
    long RebirthsNeeded,
    long RebirthRequestsSent,
    long RebirthRequestsHeld);

using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Sparkplug;

/// <summary>Log messages of the Sparkplug reader (event ids 6xxx).</summary>
public static partial class SparkplugLog
{
    [LoggerMessage(6001, LogLevel.Information, "Sparkplug birth of {Source} with {Metrics} metrics")]
    public static partial void Birth(ILogger logger, string source, int metrics);

    [LoggerMessage(6002, LogLevel.Warning, "Sparkplug death of {Source}: its loops are stale from now")]
    public static partial void Death(ILogger logger, string source);

    [LoggerMessage(6003, LogLevel.Warning, "Sparkplug edge node {Source} is out of step ({Reason}); {Action}")]
    public static partial void OutOfStep(ILogger logger, string source, string reason, string action);

    [LoggerMessage(6004, LogLevel.Warning, "Sparkplug payload on {Topic} could not be read: {Error}")]
    public static partial void Malformed(ILogger logger, string topic, string error);

    [LoggerMessage(6005, LogLevel.Information, "Sparkplug rebirth requested from {Topic}")]
    public static partial void RebirthSent(ILogger logger, string topic);

    [LoggerMessage(6006, LogLevel.Warning, "Sparkplug rebirth request on {Topic} failed ({Error})")]
    public static partial void RebirthFailed(ILogger logger, string topic, string error);

    [LoggerMessage(6007, LogLevel.Information, "Sparkplug death of {Source} ignored: its bdSeq {Seq} is not the one of the current birth")]
    public static partial void OldDeath(ILogger logger, string source, ulong seq);
}

using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Service;

/// <summary>Log messages of the service host and configuration reload (47xx, host range).</summary>
internal static partial class ServiceLog
{
    [LoggerMessage(4701, LogLevel.Information, "LoopWatch {Verb} started: {Loops} loops, broker {Host}:{Port}, dashboard {Dashboard}, data folder {DataDir}")]
    public static partial void Started(ILogger logger, string verb, int loops, string host, int port, string dashboard, string dataDir);

    [LoggerMessage(4710, LogLevel.Information, "Configuration {File} reloaded: {Added} loops added, {Removed} removed, {Changed} changed, {Kept} kept")]
    public static partial void Reloaded(ILogger logger, string file, int added, int removed, int changed, int kept);

    [LoggerMessage(4711, LogLevel.Error, "Configuration {File} refused, the running configuration is kept: {Problem}")]
    public static partial void ReloadRefused(ILogger logger, string file, string problem);

    [LoggerMessage(4712, LogLevel.Warning, "Configuration {File}: changes outside LoopWatch:Loops ({Sections}) take effect at the next restart")]
    public static partial void NeedsRestart(ILogger logger, string file, string sections);

    [LoggerMessage(4713, LogLevel.Information, "Loop {LoopId} {Change} by a configuration reload")]
    public static partial void LoopChanged(ILogger logger, string loopId, string change);

    [LoggerMessage(4715, LogLevel.Error, "Watching configuration {File} failed ({Error}); loop changes in it are not seen until a restart")]
    public static partial void WatchFailed(ILogger logger, string file, string error);

    [LoggerMessage(4714, LogLevel.Warning, "Subscription change after a configuration reload failed ({Error}); the next reconnect subscribes afresh")]
    public static partial void SubscriptionFailed(ILogger logger, string error);
}

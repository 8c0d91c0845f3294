using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Storage;

/// <summary>Log messages of the agent's storage wiring (5xxx).</summary>
internal static partial class StorageLog
{
    [LoggerMessage(5101, LogLevel.Information, "Retention removed {Journal} journal and {Hourly} hourly rows older than {Cutoff}")]
    public static partial void Pruned(ILogger logger, long journal, long hourly, DateTimeOffset cutoff);

    [LoggerMessage(5102, LogLevel.Warning, "Retention pass failed")]
    public static partial void PruneFailed(ILogger logger, Exception error);

    [LoggerMessage(5103, LogLevel.Information, "Database {Path} open at schema version {Version}")]
    public static partial void Opened(ILogger logger, string path, int version);
}

using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Alarms;

/// <summary>Log messages of the alarm engine's hosting (46xx, host range).</summary>
internal static partial class AlarmLog
{
    [LoggerMessage(4601, LogLevel.Warning, "Publishing loop health failed ({Error}); retrying")]
    public static partial void HealthPublishFailed(ILogger logger, string error);

    [LoggerMessage(4602, LogLevel.Information, "Alarm {Id}: {From} -> {To} ({Trigger})")]
    public static partial void Transition(ILogger logger, string id, string from, string to, string trigger);
}

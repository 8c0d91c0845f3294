using LoopWatch.Agent.Ingest;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent;

/// <summary>The agent's log messages, with stable event ids (1xxx ingest, 2xxx broker, 3xxx demo, 4xxx host).</summary>
public static partial class AgentLog
{
    [LoggerMessage(1001, LogLevel.Warning, "Payload on {Topic} rejected ({Reason}); {Suppressed} more rejections not logged since the last line")]
    public static partial void PayloadRejected(ILogger logger, string topic, RejectReason reason, long suppressed);

    [LoggerMessage(1002, LogLevel.Information, "Connected to MQTT broker {Host}:{Port}; subscribed to {Topics} topics")]
    public static partial void Subscribed(ILogger logger, string host, int port, int topics);

    [LoggerMessage(1003, LogLevel.Warning, "MQTT broker {Host}:{Port} unreachable ({Error}); retrying in {DelaySeconds} s")]
    public static partial void BrokerUnreachable(ILogger logger, string host, int port, string error, double delaySeconds);

    [LoggerMessage(1004, LogLevel.Warning, "Disconnected from MQTT broker ({Reason})")]
    public static partial void Disconnected(ILogger logger, string reason);

    [LoggerMessage(1008, LogLevel.Warning, "TLS to MQTT broker {Host}:{Port} refused: {Reason}")]
    public static partial void CertificateRefused(ILogger logger, string host, int port, string reason);

    [LoggerMessage(1009, LogLevel.Information, "TLS to MQTT broker {Host}:{Port}: {Certificate}")]
    public static partial void TlsConnected(ILogger logger, string host, int port, string certificate);

    [LoggerMessage(1005, LogLevel.Information, "Finding {Change} on {LoopId}: {Kind}")]
    public static partial void FindingChanged(ILogger logger, string loopId, string change, string kind);

    [LoggerMessage(1007, LogLevel.Debug, "Finding updated on {LoopId}: {Kind}")]
    public static partial void FindingUpdated(ILogger logger, string loopId, string kind);

    [LoggerMessage(1006, LogLevel.Error, "Detector failed on loop {LoopId}; the sample is skipped")]
    public static partial void DetectorFailed(ILogger logger, Exception error, string loopId);

    [LoggerMessage(2001, LogLevel.Information, "Embedded MQTT broker listening on {Address}:{Port}")]
    public static partial void BrokerStarted(ILogger logger, string address, int port);

    [LoggerMessage(2002, LogLevel.Warning, "Embedded MQTT broker dropped a message for {ClientId}: its queue was full ({Limit} messages, Broker:MaxPendingMessagesPerClient); {Dropped} dropped since start")]
    public static partial void BrokerDropped(ILogger logger, string clientId, long dropped, int limit);

    [LoggerMessage(2003, LogLevel.Warning, "Embedded MQTT broker lost client {ClientId} ({DisconnectType}, reason {Reason}); QoS 0 messages on its way are gone")]
    public static partial void BrokerClientLost(ILogger logger, string clientId, string disconnectType, string reason);

    [LoggerMessage(3001, LogLevel.Information, "Demo plant publishing {Loops} loops at {Speed}x")]
    public static partial void DemoStarted(ILogger logger, int loops, double speed);

    [LoggerMessage(3002, LogLevel.Warning, "Demo plant publish failed ({Error}); retrying")]
    public static partial void DemoPublishFailed(ILogger logger, string error);
}

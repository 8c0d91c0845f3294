namespace LoopWatch.Dashboard.Model;

/// <summary>Counters of the ingest path since start; the last splits the rejected payloads by why (snake_case reason).</summary>
public readonly record struct IngestCounters(
    long Received,
    long Accepted,
    long Rejected,
    long UnknownTopic,
    long Late,
    bool BrokerConnected,
    long Reconnects,
    IReadOnlyDictionary<string, long>? RejectedByReason = null);

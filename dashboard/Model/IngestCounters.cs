namespace LoopWatch.Dashboard.Model;

/// <summary>Counters of the ingest path since start.</summary>
public readonly record struct IngestCounters(
    long Received,
    long Accepted,
    long Rejected,
    long UnknownTopic,
    long Late,
    bool BrokerConnected,
    long Reconnects);

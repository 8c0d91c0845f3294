namespace LoopWatch.Agent.Ingest;

/// <summary>Why a payload was not taken.</summary>
public enum RejectReason : byte
{
    None,
    Empty,
    TooLarge,
    NotANumber,
    NotFinite,
    BadJson,
    BadTimestamp,
    BadQuality,

    /// <summary>The timestamp lies more than <c>Broker:MaxLeadSeconds</c> ahead of the receive time.</summary>
    FutureTimestamp,
}

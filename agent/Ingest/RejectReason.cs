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
}

using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Ingest;

/// <summary>Where one topic's values go, with that tag's own counters.</summary>
public sealed class TagRoute(LoopCell cell, Signal signal, string tag, TagValueKind valueKind)
{
    public LoopCell Cell { get; } = cell;
    public Signal Signal { get; } = signal;
    public string Tag { get; } = tag;
    public TagValueKind ValueKind { get; } = valueKind;

    /// <summary>Values taken from this tag.</summary>
    public long Accepted;

    /// <summary>Payloads on this tag that could not be read.</summary>
    public long Rejected;
}

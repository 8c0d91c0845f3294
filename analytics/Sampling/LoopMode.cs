namespace LoopWatch.Analytics.Sampling;

/// <summary>Controller mode; the numeric values are those a mode tag carries (0 manual, 1 auto, 2 cascade).</summary>
public enum LoopMode : byte
{
    Manual = 0,
    Auto = 1,
    Cascade = 2,

    /// <summary>No mode tag configured or nothing received yet; treated as auto.</summary>
    Unknown = 3,
}

namespace LoopWatch.Analytics.Sampling;

/// <summary>
/// One sampling instant of a loop with every tag's latest value held (sample-and-hold in event time).
/// Engineering units for PV and SP, % for OP and position; NaN where the loop has no such tag.
/// </summary>
public readonly record struct AlignedSample(long Ticks, double Pv, double Sp, double Op, double Position, LoopMode Mode, bool PvGood)
{
    /// <summary>True when the controller acts on its own: auto, cascade, or mode unknown.</summary>
    public bool InAuto => Mode != LoopMode.Manual;
}

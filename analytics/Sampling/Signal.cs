namespace LoopWatch.Analytics.Sampling;

/// <summary>Which of a loop's tags a value belongs to.</summary>
public enum Signal : byte
{
    Pv = 0,
    Sp = 1,
    Op = 2,
    Mode = 3,
    Position = 4,
}

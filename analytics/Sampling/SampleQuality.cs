namespace LoopWatch.Analytics.Sampling;

/// <summary>Quality of one value as the source reports it; bad values are held out of the statistics and counted.</summary>
public enum SampleQuality : byte
{
    Good = 0,
    Uncertain = 1,
    Bad = 2,
}

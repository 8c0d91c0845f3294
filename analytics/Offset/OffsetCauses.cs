namespace LoopWatch.Analytics.Offset;

/// <summary>The values of <see cref="OffsetFinding.Cause"/>.</summary>
public static class OffsetCauses
{
    /// <summary>The output sat at a limit most of the time: the final element cannot do more.</summary>
    public const string OutputSaturated = "output-saturated";

    /// <summary>The output was free to move, yet the error stayed: no or weak integral action.</summary>
    public const string NoIntegralAction = "no-integral-action";
}

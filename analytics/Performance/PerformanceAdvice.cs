using LoopWatch.Analytics.Advice;
using static LoopWatch.Analytics.Advice.Rounding;

namespace LoopWatch.Analytics.Performance;

/// <summary>
/// The Harris index of a pid loop: 0 = the error variance is at the minimum the dead time allows, near 1 = far above it.
/// Standard deviations in % of span; figures rounded to 4 significant digits, each computed from the rounded ones before it.
/// </summary>
public sealed record PerformanceAdvice(
    DateTimeOffset? At,
    string? NotShownBecause,
    double? DeadTimeSeconds = null,
    double SampleSeconds = 0,
    int DelaySamples = 0,
    int Order = 0,
    int WindowSamples = 0,
    double ErrorStdPct = 0,
    double InnovationStdPct = 0,
    IReadOnlyList<double>? Impulse = null,
    double MinimumStdPct = 0,
    double Index = 0) : AdviserResult(At, NotShownBecause)
{
    /// <inheritdoc />
    public override string Adviser => "performance";

    /// <inheritdoc />
    public override string Title => "Performance index (Harris)";

    /// <inheritdoc />
    public override string Headline => Shown
        ? $"performance index {Text(Index)} (0 = minimum variance for the dead time, near 1 = far from it)"
        : $"performance index not shown: {NotShownBecause}";

    /// <inheritdoc />
    public override IReadOnlyList<string> Explanation => Shown
        ? [
            $"Window: the last {WindowSamples} samples in auto without set-point moves; the control error SP - PV has standard deviation sigma_y = {Text(ErrorStdPct)} % of span.",
            $"An AR({Order}) model of the error, fitted by least squares, leaves innovations of sigma_a = {Text(InnovationStdPct)} % of span.",
            $"Dead time {Text(DeadTimeSeconds ?? 0)} s at {Text(SampleSeconds)} s a sample is b = {DelaySamples} samples; the first b terms of the model's impulse response are " +
            $"{string.Join(", ", (Impulse ?? []).Select(Text))}.",
            $"Minimum variance (what no controller can beat with this dead time): sigma_mv = sigma_a × sqrt({string.Join(" + ", (Impulse ?? []).Select(p => Text(p) + "²"))}) = {Text(MinimumStdPct)} % of span.",
            $"Index = 1 - sigma_mv² / sigma_y² = 1 - {Text(MinimumStdPct)}² / {Text(ErrorStdPct)}² = {Text(Index)}. " +
            "Near 0 the loop is as tight as its dead time allows; a high value says tighter control is possible, not which tuning gives it.",
          ]
        : [$"The performance index is not shown: {NotShownBecause}."];
}

namespace LoopWatch.Dashboard.Charts;

/// <summary>A labelled moment on a trend (a finding raised or ended, an alarm transition).</summary>
public readonly record struct TrendMarker(DateTimeOffset At, string Label);

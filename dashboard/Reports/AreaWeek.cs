namespace LoopWatch.Dashboard.Reports;

/// <summary>One plant area's week: loops with data, loop-hours with samples and how many of them were healthy.</summary>
public sealed record AreaWeek(string Area, int Loops, int Hours, int HealthyHours)
{
    /// <summary>Healthy loop-hours as a percentage of loop-hours with samples; null without data.</summary>
    public double? HealthyPct => Hours == 0 ? null : 100.0 * HealthyHours / Hours;
}

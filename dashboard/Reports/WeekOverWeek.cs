namespace LoopWatch.Dashboard.Reports;

/// <summary>A week against the week before: changes in loops monitored, healthy share (percentage points) and alarm rate.</summary>
public sealed record WeekOverWeek(WeeklySummary This, WeeklySummary Previous)
{
    public int LoopsChange => This.LoopsMonitored - Previous.LoopsMonitored;

    /// <summary>Percentage points; null when either week has no data.</summary>
    public double? HealthyPctChange => This.HealthyPct - Previous.HealthyPct;

    public double AlarmRateChange => This.Alarms.PerTenMinutes - Previous.Alarms.PerTenMinutes;

    public int ActivationsChange => This.Alarms.Activations - Previous.Alarms.Activations;
}

namespace LoopWatch.Analytics.DeadZone;

/// <summary>
/// Settings of the dead-zone adviser. Defaults (our choice): medians over the last 6 on and off periods, figures once
/// 3 of each are measured.
/// </summary>
public sealed record DeadZoneOptions
{
    /// <summary>Half cycles (on and off periods each) the medians take.</summary>
    public int RecentHalves { get; init; } = 6;

    /// <summary>Measured on and off periods needed before figures are shown.</summary>
    public int MinHalves { get; init; } = 3;
}

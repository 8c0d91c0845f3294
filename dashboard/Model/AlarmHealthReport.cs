namespace LoopWatch.Dashboard.Model;

/// <summary>
/// Alarm-system performance over [<see cref="From"/>, <see cref="To"/>): activations, the average per 10 minutes and
/// the busiest 10-minute window against the EEMUA 191 benchmark, flood windows, chattering alarms, the ten most frequent.
/// </summary>
public sealed record AlarmHealthReport(
    DateTimeOffset From,
    DateTimeOffset To,
    int Activations,
    double PerTenMinutes,
    int PeakTenMinutes,
    int FloodWindows,
    string Rating,
    IReadOnlyList<AlarmCount> Chattering,
    IReadOnlyList<AlarmCount> MostFrequent);

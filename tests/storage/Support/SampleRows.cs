using LoopWatch.Storage.Rows;

namespace LoopWatch.Storage.Tests.Support;

/// <summary>Sample rows for a fictional plant (loop ids like FIC-101 on unit "North Mill").</summary>
public static class SampleRows
{
    public const long Hour = 3_600_000;
    public static readonly long T0 = new DateTimeOffset(2026, 3, 2, 0, 0, 0, TimeSpan.Zero).ToUnixTimeMilliseconds();

    public static AlarmJournalEntry Journal(int i, string loopId = "FIC-101") =>
        new(T0 + i, loopId, "oscillation", "medium", "normal", "unacked", $$"""{"period_s":{{i}}}""", null, null);

    public static HourlyStatsRow Hourly(string loopId, long hourMs, long samples = 3600) => new()
    {
        LoopId = loopId, HourMs = hourMs, Samples = samples, PvMean = 41.5, PvMin = 40.0, PvMax = 43.25,
        SpMean = 42.0, OpMean = 55.0, OpMin = 50.0, OpMax = 60.0, MeanErrorPct = -0.5, ErrorStdPct = 1.25,
        Reversals = 12, TravelPct = 80.5, SaturatedPct = 0, TimeInAutoPct = 100, SecondsOscillating = 900,
        SecondsAnyFinding = 900,
    };
}

namespace LoopWatch.Storage.Reading;

/// <summary>The queries of <see cref="StorageReader"/>; columns are aliased to the row property names.</summary>
internal static class ReadSql
{
    private const string JournalColumns = """
        SELECT id AS Id, time_ms AS TimeMs, loop_id AS LoopId, kind AS Kind, priority AS Priority,
               from_state AS FromState, to_state AS ToState, figures AS FiguresJson, user AS User, comment AS Comment
        FROM alarm_journal
        WHERE time_ms >= @FromMs AND time_ms < @ToMs
          AND (@LoopId IS NULL OR loop_id = @LoopId) AND (@Kind IS NULL OR kind = @Kind)
        """;

    public const string JournalNewestFirst = JournalColumns + " ORDER BY time_ms DESC, id DESC LIMIT @Limit";
    public const string JournalOldestFirst = JournalColumns + " ORDER BY time_ms, id LIMIT @Limit";

    public const string AlarmStates = """
        SELECT loop_id AS LoopId, kind AS Kind, state AS State, priority AS Priority, raised_ms AS RaisedMs,
               acked_by AS AckedBy, shelved_until_ms AS ShelvedUntilMs, shelved_by AS ShelvedBy, comment AS Comment,
               updated_ms AS UpdatedMs
        FROM alarm_state ORDER BY loop_id, kind
        """;

    private const string HourlyColumns = """
        SELECT loop_id AS LoopId, hour_ms AS HourMs, samples AS Samples, pv_mean AS PvMean, pv_min AS PvMin,
               pv_max AS PvMax, sp_mean AS SpMean, op_mean AS OpMean, op_min AS OpMin, op_max AS OpMax,
               mean_error_pct AS MeanErrorPct, error_std_pct AS ErrorStdPct, reversals AS Reversals,
               travel_pct AS TravelPct, saturated_pct AS SaturatedPct, time_in_auto_pct AS TimeInAutoPct,
               starts AS Starts, duty_pct AS DutyPct, cycle_period_s AS CyclePeriodS,
               cycle_amplitude_pct AS CycleAmplitudePct, seconds_oscillating AS SecondsOscillating,
               seconds_offset AS SecondsOffset, seconds_short_cycling AS SecondsShortCycling,
               seconds_reversals AS SecondsReversals, seconds_any_finding AS SecondsAnyFinding,
               seconds_stale AS SecondsStale, seconds_manual AS SecondsManual
        FROM hourly_stats
        """;

    public const string HourlyForLoop =
        HourlyColumns + " WHERE loop_id = @LoopId AND hour_ms >= @FromMs AND hour_ms < @ToMs ORDER BY hour_ms";

    public const string HourlyAllLoops =
        HourlyColumns + " WHERE hour_ms >= @FromMs AND hour_ms < @ToMs ORDER BY loop_id, hour_ms";

    public const string Counters = """
        SELECT loop_id AS LoopId, element AS Element, period_start_ms AS PeriodStartMs, reversals AS Reversals,
               travel_pct AS TravelPct, rainflow AS RainflowJson, updated_ms AS UpdatedMs
        FROM element_counters WHERE (@LoopId IS NULL OR loop_id = @LoopId) ORDER BY loop_id, element
        """;

    public const string Periods = """
        SELECT id AS Id, loop_id AS LoopId, element AS Element, start_ms AS StartMs, end_ms AS EndMs,
               reversals AS Reversals, travel_pct AS TravelPct, rainflow AS RainflowJson, closed_by AS ClosedBy,
               note AS Note
        FROM element_periods
        WHERE loop_id = @LoopId AND (@Element IS NULL OR element = @Element) ORDER BY element, end_ms, id
        """;

    public const string ServiceRecords = """
        SELECT id AS Id, loop_id AS LoopId, element AS Element, time_ms AS TimeMs, user AS User, note AS Note
        FROM service_records WHERE (@LoopId IS NULL OR loop_id = @LoopId)
        ORDER BY time_ms DESC, id DESC LIMIT @Limit
        """;
}

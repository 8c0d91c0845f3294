namespace LoopWatch.Storage.Writing;

/// <summary>The statements the writer runs; every value is a Dapper parameter named after a row property.</summary>
internal static class WriteSql
{
    public const string InsertJournal = """
        INSERT INTO alarm_journal (time_ms, loop_id, kind, priority, from_state, to_state, figures, user, comment)
        VALUES (@TimeMs, @LoopId, @Kind, @Priority, @FromState, @ToState, @FiguresJson, @User, @Comment)
        """;

    public const string UpsertAlarmState = """
        INSERT INTO alarm_state (loop_id, kind, state, priority, raised_ms, acked_by, shelved_until_ms, shelved_by, comment, updated_ms)
        VALUES (@LoopId, @Kind, @State, @Priority, @RaisedMs, @AckedBy, @ShelvedUntilMs, @ShelvedBy, @Comment, @UpdatedMs)
        ON CONFLICT (loop_id, kind) DO UPDATE SET
            state = excluded.state, priority = excluded.priority, raised_ms = excluded.raised_ms,
            acked_by = excluded.acked_by, shelved_until_ms = excluded.shelved_until_ms, shelved_by = excluded.shelved_by,
            comment = excluded.comment, updated_ms = excluded.updated_ms
        """;

    public const string UpsertHourlyStats = """
        INSERT INTO hourly_stats (loop_id, hour_ms, samples, pv_mean, pv_min, pv_max, sp_mean, op_mean, op_min, op_max,
            mean_error_pct, error_std_pct, reversals, travel_pct, saturated_pct, time_in_auto_pct, starts, duty_pct,
            cycle_period_s, cycle_amplitude_pct, seconds_oscillating, seconds_offset, seconds_short_cycling,
            seconds_reversals, seconds_any_finding, seconds_stale, seconds_manual)
        VALUES (@LoopId, @HourMs, @Samples, @PvMean, @PvMin, @PvMax, @SpMean, @OpMean, @OpMin, @OpMax,
            @MeanErrorPct, @ErrorStdPct, @Reversals, @TravelPct, @SaturatedPct, @TimeInAutoPct, @Starts, @DutyPct,
            @CyclePeriodS, @CycleAmplitudePct, @SecondsOscillating, @SecondsOffset, @SecondsShortCycling,
            @SecondsReversals, @SecondsAnyFinding, @SecondsStale, @SecondsManual)
        ON CONFLICT (loop_id, hour_ms) DO UPDATE SET
            samples = excluded.samples, pv_mean = excluded.pv_mean, pv_min = excluded.pv_min, pv_max = excluded.pv_max,
            sp_mean = excluded.sp_mean, op_mean = excluded.op_mean, op_min = excluded.op_min, op_max = excluded.op_max,
            mean_error_pct = excluded.mean_error_pct, error_std_pct = excluded.error_std_pct,
            reversals = excluded.reversals, travel_pct = excluded.travel_pct, saturated_pct = excluded.saturated_pct,
            time_in_auto_pct = excluded.time_in_auto_pct, starts = excluded.starts, duty_pct = excluded.duty_pct,
            cycle_period_s = excluded.cycle_period_s, cycle_amplitude_pct = excluded.cycle_amplitude_pct,
            seconds_oscillating = excluded.seconds_oscillating, seconds_offset = excluded.seconds_offset,
            seconds_short_cycling = excluded.seconds_short_cycling, seconds_reversals = excluded.seconds_reversals,
            seconds_any_finding = excluded.seconds_any_finding, seconds_stale = excluded.seconds_stale,
            seconds_manual = excluded.seconds_manual
        """;

    // A post from an older period (queued before a reset) must not overwrite the fresh zero counters.
    public const string UpsertCounters = """
        INSERT INTO element_counters (loop_id, element, period_start_ms, reversals, travel_pct, rainflow, updated_ms)
        VALUES (@LoopId, @Element, @PeriodStartMs, @Reversals, @TravelPct, @RainflowJson, @UpdatedMs)
        ON CONFLICT (loop_id, element) DO UPDATE SET
            period_start_ms = excluded.period_start_ms, reversals = excluded.reversals, travel_pct = excluded.travel_pct,
            rainflow = excluded.rainflow, updated_ms = excluded.updated_ms
        WHERE excluded.period_start_ms >= element_counters.period_start_ms
        """;

    public const string ResetElement = """
        INSERT INTO element_periods (loop_id, element, start_ms, end_ms, reversals, travel_pct, rainflow, closed_by, note)
        SELECT loop_id, element, period_start_ms, @TimeMs, reversals, travel_pct, rainflow, @User, @Note
        FROM element_counters WHERE loop_id = @LoopId AND element = @Element;
        INSERT INTO element_counters (loop_id, element, period_start_ms, reversals, travel_pct, rainflow, updated_ms)
        VALUES (@LoopId, @Element, @TimeMs, 0, 0.0, NULL, @TimeMs)
        ON CONFLICT (loop_id, element) DO UPDATE SET
            period_start_ms = excluded.period_start_ms, reversals = 0, travel_pct = 0.0, rainflow = NULL,
            updated_ms = excluded.updated_ms;
        INSERT INTO service_records (loop_id, element, time_ms, user, note)
        VALUES (@LoopId, @Element, @TimeMs, @User, @Note);
        """;

    public const string InsertServiceRecord = """
        INSERT INTO service_records (loop_id, element, time_ms, user, note)
        VALUES (@LoopId, @Element, @TimeMs, @User, @Note)
        """;
}

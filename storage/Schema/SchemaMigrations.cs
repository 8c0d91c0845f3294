namespace LoopWatch.Storage.Schema;

/// <summary>The schema steps this build knows, oldest first; append new ones, never edit a released one.</summary>
public static class SchemaMigrations
{
    /// <summary>Every migration, ordered by version.</summary>
    public static IReadOnlyList<Migration> All { get; } = [new(1, "initial", V1)];

    /// <summary>Highest version this build can open.</summary>
    public static int Latest => All[^1].Version;

    // STRICT tables so a wrong-typed value fails loudly instead of being stored under another affinity.
    private const string V1 = """
        CREATE TABLE alarm_journal (
            id          INTEGER PRIMARY KEY,
            time_ms     INTEGER NOT NULL,
            loop_id     TEXT    NOT NULL,
            kind        TEXT    NOT NULL,
            priority    TEXT    NOT NULL,
            from_state  TEXT    NOT NULL,
            to_state    TEXT    NOT NULL,
            figures     TEXT,
            user        TEXT,
            comment     TEXT
        ) STRICT;
        CREATE INDEX ix_alarm_journal_time ON alarm_journal (time_ms);
        CREATE INDEX ix_alarm_journal_loop_time ON alarm_journal (loop_id, time_ms);
        CREATE TRIGGER alarm_journal_append_only BEFORE UPDATE ON alarm_journal
        BEGIN SELECT RAISE(ABORT, 'alarm_journal is append-only'); END;

        CREATE TABLE alarm_state (
            loop_id           TEXT    NOT NULL,
            kind              TEXT    NOT NULL,
            state             TEXT    NOT NULL,
            priority          TEXT    NOT NULL,
            raised_ms         INTEGER,
            acked_by          TEXT,
            shelved_until_ms  INTEGER,
            shelved_by        TEXT,
            comment           TEXT,
            updated_ms        INTEGER NOT NULL,
            PRIMARY KEY (loop_id, kind)
        ) STRICT;

        CREATE TABLE hourly_stats (
            loop_id                TEXT    NOT NULL,
            hour_ms                INTEGER NOT NULL,
            samples                INTEGER NOT NULL,
            pv_mean                REAL,
            pv_min                 REAL,
            pv_max                 REAL,
            sp_mean                REAL,
            op_mean                REAL,
            op_min                 REAL,
            op_max                 REAL,
            mean_error_pct         REAL,
            error_std_pct          REAL,
            reversals              INTEGER,
            travel_pct             REAL,
            saturated_pct          REAL,
            time_in_auto_pct       REAL,
            starts                 INTEGER,
            duty_pct               REAL,
            cycle_period_s         REAL,
            cycle_amplitude_pct    REAL,
            seconds_oscillating    REAL,
            seconds_offset         REAL,
            seconds_short_cycling  REAL,
            seconds_reversals      REAL,
            seconds_any_finding    REAL,
            seconds_stale          REAL,
            seconds_manual         REAL,
            PRIMARY KEY (loop_id, hour_ms)
        ) STRICT;
        CREATE INDEX ix_hourly_stats_hour ON hourly_stats (hour_ms);

        CREATE TABLE element_counters (
            loop_id          TEXT    NOT NULL,
            element          TEXT    NOT NULL,
            period_start_ms  INTEGER NOT NULL,
            reversals        INTEGER NOT NULL,
            travel_pct       REAL    NOT NULL,
            rainflow         TEXT,
            updated_ms       INTEGER NOT NULL,
            PRIMARY KEY (loop_id, element)
        ) STRICT;

        CREATE TABLE element_periods (
            id          INTEGER PRIMARY KEY,
            loop_id     TEXT    NOT NULL,
            element     TEXT    NOT NULL,
            start_ms    INTEGER NOT NULL,
            end_ms      INTEGER NOT NULL,
            reversals   INTEGER NOT NULL,
            travel_pct  REAL    NOT NULL,
            rainflow    TEXT,
            closed_by   TEXT    NOT NULL,
            note        TEXT
        ) STRICT;
        CREATE INDEX ix_element_periods_loop ON element_periods (loop_id, element, end_ms);

        CREATE TABLE service_records (
            id       INTEGER PRIMARY KEY,
            loop_id  TEXT    NOT NULL,
            element  TEXT    NOT NULL,
            time_ms  INTEGER NOT NULL,
            user     TEXT    NOT NULL,
            note     TEXT
        ) STRICT;
        CREATE INDEX ix_service_records_loop ON service_records (loop_id, time_ms);

        CREATE TABLE users (
            id             INTEGER PRIMARY KEY,
            name           TEXT    NOT NULL UNIQUE,
            role           TEXT    NOT NULL,
            password_hash  TEXT    NOT NULL,
            created_ms     INTEGER NOT NULL
        ) STRICT;
        """;
}

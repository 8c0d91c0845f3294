using Dapper;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Storage.Reading;

/// <summary>Queries for the agent's restart, the dashboard and reports; each call uses its own pooled connection.</summary>
public sealed class StorageReader(LoopWatchDatabase database)
{
    /// <summary>Alarm transitions matching <paramref name="query"/>.</summary>
    public Task<IReadOnlyList<AlarmJournalEntry>> ReadJournalAsync(JournalQuery query, CancellationToken cancellationToken = default) =>
        QueryAsync<AlarmJournalEntry>(query.OldestFirst ? ReadSql.JournalOldestFirst : ReadSql.JournalNewestFirst, query, cancellationToken);

    /// <summary>Every stored (loop, kind) alarm state, to restore active alarms and shelves.</summary>
    public Task<IReadOnlyList<AlarmStateRow>> ReadAlarmStatesAsync(CancellationToken cancellationToken = default) =>
        QueryAsync<AlarmStateRow>(ReadSql.AlarmStates, null, cancellationToken);

    /// <summary>One loop's hourly statistics with hour start in [<paramref name="fromMs"/>, <paramref name="toMs"/>), oldest first.</summary>
    public Task<IReadOnlyList<HourlyStatsRow>> ReadHourlyStatsAsync(
        string loopId, long fromMs, long toMs, CancellationToken cancellationToken = default) =>
        QueryAsync<HourlyStatsRow>(ReadSql.HourlyForLoop, new { LoopId = loopId, FromMs = fromMs, ToMs = toMs }, cancellationToken);

    /// <summary>All loops' hourly statistics with hour start in [<paramref name="fromMs"/>, <paramref name="toMs"/>), by loop then hour.</summary>
    public Task<IReadOnlyList<HourlyStatsRow>> ReadHourlyStatsAsync(
        long fromMs, long toMs, CancellationToken cancellationToken = default) =>
        QueryAsync<HourlyStatsRow>(ReadSql.HourlyAllLoops, new { FromMs = fromMs, ToMs = toMs }, cancellationToken);

    /// <summary>Current-period counters of one loop's elements, or of all loops when <paramref name="loopId"/> is null.</summary>
    public Task<IReadOnlyList<ElementCounterRow>> ReadCountersAsync(string? loopId = null, CancellationToken cancellationToken = default) =>
        QueryAsync<ElementCounterRow>(ReadSql.Counters, new { LoopId = loopId }, cancellationToken);

    /// <summary>Closed service periods of a loop (optionally one element), oldest first.</summary>
    public Task<IReadOnlyList<ElementPeriodRow>> ReadPeriodsAsync(
        string loopId, string? element = null, CancellationToken cancellationToken = default) =>
        QueryAsync<ElementPeriodRow>(ReadSql.Periods, new { LoopId = loopId, Element = element }, cancellationToken);

    /// <summary>Service records of a loop, or of all loops when <paramref name="loopId"/> is null, newest first.</summary>
    public Task<IReadOnlyList<ServiceRecordRow>> ReadServiceRecordsAsync(
        string? loopId = null, int limit = 1_000, CancellationToken cancellationToken = default) =>
        QueryAsync<ServiceRecordRow>(ReadSql.ServiceRecords, new { LoopId = loopId, Limit = limit }, cancellationToken);

    private async Task<IReadOnlyList<T>> QueryAsync<T>(string sql, object? parameters, CancellationToken cancellationToken)
    {
        await using var connection = database.OpenConnection();
        var rows = await connection.QueryAsync<T>(
            new CommandDefinition(sql, parameters, cancellationToken: cancellationToken)).ConfigureAwait(false);
        return rows.AsList();
    }
}

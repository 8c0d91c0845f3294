using LoopWatch.Agent.Ingest;
using LoopWatch.Storage.Retention;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Storage;

/// <summary>
/// Once an hour (wall clock), removes journal and hourly rows older than <c>RetentionDays</c> of plant time, since
/// both tables are keyed by event time.
/// </summary>
public sealed class RetentionService(AgentStorage storage, PlantState plant, TimeProvider time, ILogger<RetentionService> log) : BackgroundService
{
    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var timer = new PeriodicTimer(TimeSpan.FromHours(1), time);
        try
        {
            do
            {
                try
                {
                    var cutoff = plant.Now - TimeSpan.FromDays(storage.Database.Options.RetentionDays);
                    var pruned = await new RetentionPruner(storage.Database, time).PruneAsync(cutoff, stoppingToken);
                    if (pruned.JournalRows + pruned.HourlyRows > 0) StorageLog.Pruned(log, pruned.JournalRows, pruned.HourlyRows, cutoff);
                }
                catch (Exception e) when (e is not OperationCanceledException)
                {
                    StorageLog.PruneFailed(log, e);
                }
            }
            while (await timer.WaitForNextTickAsync(stoppingToken));
        }
        catch (OperationCanceledException) { }
    }
}

using Microsoft.Extensions.Hosting;

namespace LoopWatch.Agent.Ingest;

/// <summary>Once a wall second, moves every loop to the plant's time so silent loops go stale.</summary>
public sealed class PlantTicker(PlantState plant, TimeProvider time) : BackgroundService
{
    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var timer = new PeriodicTimer(TimeSpan.FromSeconds(1), time);
        try
        {
            while (await timer.WaitForNextTickAsync(stoppingToken)) plant.AdvanceAll();
        }
        catch (OperationCanceledException) { }
    }
}

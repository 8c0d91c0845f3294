using LoopWatch.Agent.Configuration;
using Microsoft.Extensions.Hosting;

namespace LoopWatch.Agent.Valves;

/// <summary>Restores the final-element counters at start, saves them every <see cref="ValveOptions.SaveEverySeconds"/> and once more at shutdown.</summary>
public sealed class ValveCounterSaver(ValveWear wear, ValveOptions options, TimeProvider time) : BackgroundService
{
    /// <inheritdoc />
    public override Task StartAsync(CancellationToken cancellationToken)
    {
        wear.Restore();
        return base.StartAsync(cancellationToken);
    }

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var timer = new PeriodicTimer(TimeSpan.FromSeconds(options.SaveEverySeconds), time);
        try
        {
            while (await timer.WaitForNextTickAsync(stoppingToken)) wear.Save();
        }
        catch (OperationCanceledException) { }
    }

    /// <inheritdoc />
    public override async Task StopAsync(CancellationToken cancellationToken)
    {
        await base.StopAsync(cancellationToken);
        wear.Save();
    }
}

using LoopWatch.Agent.Ingest;
using Microsoft.Extensions.Hosting;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// Once a wall second, evaluates every loop's alarms at the plant's time, so alarms of silent loops (stale) and shelf
/// expiries move on even without samples.
/// </summary>
public sealed class AlarmTicker(PlantState plant, AlarmEngine engine, TimeProvider time) : BackgroundService
{
    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var timer = new PeriodicTimer(TimeSpan.FromSeconds(1), time);
        try
        {
            while (await timer.WaitForNextTickAsync(stoppingToken)) Tick();
        }
        catch (OperationCanceledException) { }
    }

    /// <summary>One evaluation pass at the plant's time now.</summary>
    public void Tick()
    {
        var now = plant.Clock.NowTicks;
        foreach (var cell in plant.Cells)
        {
            if (engine.Loop(cell.Spec.Id) is not { } alarms) continue;
            cell.Read(m =>
            {
                m.Advance(now);
                var snap = m.Snapshot;
                alarms.Evaluate(now, snap.Mode, m.Board, m.Statistics, snap.Pv);
                return 0;
            });
        }
    }
}

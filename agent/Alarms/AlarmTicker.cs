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
        // Allocation-free (offline analysis ticks once per event second): indexed loop, state passed to a static lambda,
        // the cell's own statistics delegate. Cells and alarms are looked up afresh each tick.
        var cells = plant.Cells;
        for (var i = 0; i < cells.Count; i++)
        {
            var cell = cells[i];
            if (engine.Loop(cell.Spec.Id) is not { } alarms) continue;
            cell.Read((alarms, cell.Statistics, now), static (m, s) =>
            {
                m.Advance(s.now);
                var snap = m.Snapshot;
                s.alarms.Evaluate(s.now, snap.Mode, m.Board, s.Statistics, snap.Pv);
                return 0;
            });
        }
    }
}

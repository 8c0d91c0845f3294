using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Monitoring;
using Microsoft.Extensions.Hosting;

namespace LoopWatch.Agent.Alarms;

/// <summary>
/// Once a wall second, evaluates every loop's alarms at the plant's time, so alarms of silent loops (stale) and shelf
/// expiries move on even without samples.
/// </summary>
public sealed class AlarmTicker : BackgroundService
{
    private readonly PlantState _plant;
    private readonly TimeProvider _time;
    private readonly (LoopCell Cell, LoopAlarms Alarms, Func<LoopStatistics> Statistics)[] _targets;

    /// <summary>A ticker over the loops of <paramref name="plant"/> that have alarms in <paramref name="engine"/>.</summary>
    public AlarmTicker(PlantState plant, AlarmEngine engine, TimeProvider time)
    {
        _plant = plant;
        _time = time;
        // Cells and alarms are fixed at start: look them up once, so a tick allocates nothing (offline analysis ticks once per event second).
        _targets = plant.Cells.Where(c => engine.Loop(c.Spec.Id) is not null)
            .Select(c => (c, engine.Loop(c.Spec.Id)!, c.Read<Func<LoopStatistics>>(m => m.Statistics)))
            .ToArray();
    }

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var timer = new PeriodicTimer(TimeSpan.FromSeconds(1), _time);
        try
        {
            while (await timer.WaitForNextTickAsync(stoppingToken)) Tick();
        }
        catch (OperationCanceledException) { }
    }

    /// <summary>One evaluation pass at the plant's time now.</summary>
    public void Tick()
    {
        var now = _plant.Clock.NowTicks;
        foreach (var t in _targets)
        {
            t.Cell.Read((t, now), static (m, s) =>
            {
                m.Advance(s.now);
                var snap = m.Snapshot;
                s.t.Alarms.Evaluate(s.now, snap.Mode, m.Board, s.t.Statistics, snap.Pv);
                return 0;
            });
        }
    }
}

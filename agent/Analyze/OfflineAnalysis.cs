using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Monitoring;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Runs historian files through the live path: every value goes to <see cref="PlantState.Take"/>, findings feed the
/// <see cref="AlarmEngine"/> as live (<see cref="AlarmFeed"/>), and whenever the files' event time passes a second every
/// loop is moved on (<see cref="PlantState.AdvanceTo"/>) and its alarms evaluated (<see cref="AlarmTicker.Tick"/>),
/// as the live tickers do once a second, so stale data, gaps and alarm delays are judged exactly as live.
/// </summary>
public sealed class OfflineAnalysis(IReadOnlyList<LoopSpec> specs, int trendPoints = 600)
{
    /// <summary>Only values at or after this time (UTC ticks) are analysed.</summary>
    public long FromTicks { get; init; } = long.MinValue;

    /// <summary>Only values before this time (UTC ticks) are analysed.</summary>
    public long ToTicks { get; init; } = long.MaxValue;

    /// <summary>Called now and then with bytes read and total bytes.</summary>
    public Action<long, long>? Progress { get; init; }

    /// <summary>Analyses <paramref name="files"/> merged by time.</summary>
    public AnalysisResult Run(IReadOnlyList<string> files)
    {
        var time = new EventTime();
        var collector = new FindingCollector();
        var accumulators = new Dictionary<string, SpanAccumulator>(StringComparer.Ordinal);
        var alarms = new AlarmRecord();
        // One thread feeds and reads everything here, so the cells and alarms skip the locks the live agent needs.
        var engine = new AlarmEngine(specs, [alarms], shared: false);
        var plant = new PlantState(specs, new PlantClock(time), time, NullLogger<PlantState>.Instance, collector.Take, (spec, statistics) =>
        {
            var a = new SpanAccumulator(spec, trendPoints);
            accumulators[spec.Id] = a;
            return [new AlarmFeed(engine.Loop(spec.Id)!, statistics), a];
        }, shared: false);
        var ticker = new AlarmTicker(plant, engine, time);
        var rejects = new RowRejects();
        var routes = new Dictionary<string, TagRoute>(plant.Routes, StringComparer.Ordinal);
        var readers = new List<HistorianReader>();
        long values = 0, outside = 0;
        try
        {
            foreach (var f in files)
            {
                try
                {
                    var reader = new HistorianReader(f, routes, rejects);
                    if (reader.Empty) rejects.File(f, "empty file (no header)");
                    readers.Add(reader);
                }
                catch (Exception e) when (e is IOException or InvalidDataException or UnauthorizedAccessException)
                {
                    rejects.File(f, e.Message);
                }
            }
            var total = readers.Sum(r => r.Length);
            var merge = new TimeMerge(readers);
            var second = long.MinValue;
            var lastTicks = 0L;
            while (merge.Next(out var rec))
            {
                if (rec.Ticks < FromTicks || rec.Ticks >= ToTicks) { outside++; continue; }
                var s = rec.Ticks / TimeSpan.TicksPerSecond;
                if (s > second)
                {
                    // Move every loop to the new second before its values land, as the live ticker would have done in between.
                    time.MoveTo(rec.Ticks);
                    if (second != long.MinValue)
                    {
                        plant.AdvanceTo(rec.Ticks);
                        ticker.Tick();
                    }
                    second = s;
                    if (Progress is not null && (s & 255) == 0) Progress(readers.Sum(r => r.Position), total);
                }
                if (rec.Ticks > lastTicks) lastTicks = rec.Ticks;
                plant.Take(rec.Route, rec.Ticks, rec.Value, rec.Quality);
                values++;
            }
            if (lastTicks > 0)
            {
                plant.AdvanceTo(lastTicks);
                ticker.Tick();
            }
            Progress?.Invoke(total, total);
            var rows = readers.Sum(r => r.Rows);
            var loops = plant.Cells.Select(c => Result(c, accumulators[c.Spec.Id], collector)).ToList();
            long late = loops.Sum(l => l.LateValues);
            return new AnalysisResult(loops, rejects, files, rows, values, outside, late, plant, engine, alarms);
        }
        finally
        {
            foreach (var r in readers) r.Dispose();
        }
    }

    private static LoopResult Result(LoopCell cell, SpanAccumulator acc, FindingCollector findings)
    {
        var (snapshot, window) = cell.Read(m => (m.Snapshot, m.Statistics()));
        var points = acc.Trend.Points();
        DateTimeOffset? from = snapshot.Samples > 0 ? new DateTimeOffset(acc.FirstTicks, TimeSpan.Zero) : null;
        DateTimeOffset? to = snapshot.Samples > 0 ? new DateTimeOffset(acc.LastTicks, TimeSpan.Zero) : null;
        return new LoopResult(cell.Spec, snapshot.Samples, snapshot.LateValues, snapshot.BadSamples, from, to, acc.Figures(), window,
            findings.For(cell.Spec.Id).ToList(), points);
    }
}

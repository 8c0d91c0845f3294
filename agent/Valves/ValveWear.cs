using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Storage;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Agent.Valves;

/// <summary>
/// Final-element counters of every pid loop: restored from the database at start, saved periodically, reset by a
/// recorded service (the old period is kept by storage), and shown to maintenance.
/// </summary>
public sealed class ValveWear(PlantState plant, AgentStorage storage, ValveOptions options, TimeProvider time) : IValveView
{
    public const string OutputElement = "op";
    public const string PositionElement = "position";

    /// <summary>Seeds each counter (or only those of <paramref name="loopIds"/>, loops a reload added) from the stored period; call before data flows.</summary>
    public void Restore(IReadOnlySet<string>? loopIds = null)
    {
        var rows = storage.Reader.ReadCountersAsync().GetAwaiter().GetResult().ToDictionary(r => (r.LoopId, r.Element));
        foreach (var (cell, element, counter) in Elements())
        {
            if (loopIds is not null && !loopIds.Contains(cell.Spec.Id)) continue;
            if (!rows.TryGetValue((cell.Spec.Id, element), out var row)) continue;
            cell.Read(_ =>
            {
                counter.Seed(new ElementCounters(row.Reversals, row.TravelPct, DateTimeOffset.FromUnixTimeMilliseconds(row.PeriodStartMs).UtcTicks));
                if (RainflowJson.Parse(row.RainflowJson) is { } rf) counter.Rainflow.Seed(rf.Closed, rf.Residue);
                return 0;
            });
        }
    }

    /// <summary>Posts every element's counters to the writer.</summary>
    public void Save()
    {
        var now = time.GetUtcNow().ToUnixTimeMilliseconds();
        foreach (var (cell, element, counter) in Elements())
        {
            var row = cell.Read(_ =>
            {
                var c = counter.Counters;
                if (c.SinceTicks == 0) return (ElementCounterRow?)null;
                return new ElementCounterRow(cell.Spec.Id, element, new DateTimeOffset(c.SinceTicks, TimeSpan.Zero).ToUnixTimeMilliseconds(),
                    c.Reversals, c.TravelPct, RainflowJson.From(counter.Rainflow).ToJson(), now);
            });
            if (row is { } r) storage.Writer.Post(r);
        }
    }

    /// <inheritdoc />
    public IReadOnlyList<ValveView> Valves()
    {
        var list = new List<ValveView>();
        foreach (var (cell, element, counter) in Elements())
        {
            list.Add(cell.Read(_ =>
            {
                var c = counter.Counters;
                var perDayRev = counter.ReversalsPerHour * 24;
                var perDayTravel = counter.TravelPctPerHour * 24;
                var (days, due) = Projection(c, perDayRev, perDayTravel);
                return new ValveView(cell.Spec.Id, element, cell.Spec.Description, cell.Spec.Area, perDayRev, perDayTravel, c.Reversals, c.TravelPct,
                    c.SinceTicks == 0 ? null : new DateTimeOffset(c.SinceTicks, TimeSpan.Zero),
                    RainflowCounter.BinEdgesPct, counter.Rainflow.Histogram(), days, due);
            }));
        }
        return list.OrderByDescending(v => v.TravelPctPerDay ?? -1).ThenBy(v => v.LoopId, StringComparer.Ordinal).ToList();
    }

    /// <inheritdoc />
    public bool RecordService(string loopId, string element, string user, string? note)
    {
        var target = Elements().FirstOrDefault(e => e.Cell.Spec.Id == loopId && e.Element == element);
        if (target.Counter is null) return false;
        // Store the period's final counts first: storage closes the period from what it holds.
        Save();
        var at = plant.Now;
        target.Cell.Read(_ =>
        {
            target.Counter.Seed(new ElementCounters(0, 0, at.UtcTicks));
            target.Counter.Rainflow.Seed(new double[RainflowCounter.BinEdgesPct.Count - 1], []);
            return 0;
        });
        storage.Writer.Post(new ElementReset(loopId, element, at.ToUnixTimeMilliseconds(), user, note));
        return true;
    }

    private (double? Days, string? Due) Projection(ElementCounters c, double? reversalsPerDay, double? travelPctPerDay)
    {
        double? byReversals = reversalsPerDay is > 0 ? (options.ServiceAfterReversals - c.Reversals) / reversalsPerDay : null;
        double? byTravel = travelPctPerDay is > 0 ? (options.ServiceAfterStrokes * 100 - c.TravelPct) / travelPctPerDay : null;
        if (byReversals is null && byTravel is null) return (null, null);
        if (byTravel is null || (byReversals is { } r && r < byTravel)) return (Math.Max(0, byReversals!.Value), "reversals");
        return (Math.Max(0, byTravel.Value), "travel");
    }

    private IEnumerable<(LoopCell Cell, string Element, ReversalCounter Counter)> Elements()
    {
        foreach (var cell in plant.Cells)
        {
            if (cell.Reversals is not { } d) continue;
            yield return (cell, OutputElement, d.Output);
            if (d.Position is { } p) yield return (cell, PositionElement, p);
        }
    }
}

using System.Text.Json;
using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Service;
using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Valves;
using LoopWatch.Analytics.Configuration;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Reload;

/// <summary>
/// Reads the configuration file again and applies its loops to the running agent; a file with any problem is refused
/// whole (each problem logged with its key) and the running loops stay. Only <c>LoopWatch:Loops</c> is applied live.
/// </summary>
public sealed class LoopReload(AgentOptions started, IReadOnlyList<LoopSpec> specs, PlantState plant, AlarmEngine alarms, ValveWear valves,
    AgentStorage storage, Dashboard.Reports.WeeklySources weekly, ILogger<LoopReload> log)
{
    private readonly SemaphoreSlim _gate = new(1, 1);
    private IReadOnlyList<LoopSpec> _running = specs;

    /// <summary>Reads <paramref name="source"/> and applies it; false when it was refused.</summary>
    public async Task<bool> ApplyAsync(ConfigurationSource source, CancellationToken cancellationToken)
    {
        await _gate.WaitAsync(cancellationToken);
        try
        {
            var errors = new List<string>();
            var options = AgentConfiguration.Load(source.File, new Dictionary<string, string?>(source.Overrides), errors);
            var next = errors.Count == 0 ? AgentOptionsCheck.Check(options, errors) : [];
            if (errors.Count > 0)
            {
                foreach (var e in errors) ServiceLog.ReloadRefused(log, source.File, e);
                return false;
            }
            if (NeedRestart(started, options) is { Count: > 0 } sections) ServiceLog.NeedsRestart(log, source.File, string.Join(", ", sections));

            var change = LoopSetChange.Between(_running, next);
            if (!change.None)
            {
                // Valve counters of loops that go or restart are stored first, so a fresh cell (or a later re-add) continues from them.
                if (change.Removed.Count > 0 || change.Changed.Count > 0)
                {
                    valves.Save();
                    await storage.Writer.FlushAsync(cancellationToken);
                }
                alarms.Reconfigure(next, change, plant.Clock.NowTicks);
                plant.Reconfigure(next, change);
                valves.Restore(change.Added.Concat(change.Changed).ToHashSet(StringComparer.Ordinal));
                foreach (var id in change.Added) ServiceLog.LoopChanged(log, id, "added");
                foreach (var id in change.Removed) ServiceLog.LoopChanged(log, id, "removed");
                foreach (var id in change.Changed) ServiceLog.LoopChanged(log, id, "changed");
            }
            _running = next;
            weekly.Reconfigure(options.LoopAreas());
            ServiceLog.Reloaded(log, source.File, change.Added.Count, change.Removed.Count, change.Changed.Count, change.Kept.Count);
            return true;
        }
        finally
        {
            _gate.Release();
        }
    }

    // Sections read once at start; their changes are reported, not applied.
    private static List<string> NeedRestart(AgentOptions running, AgentOptions next)
    {
        var sections = new List<string>();
        if (Differ(running.Broker, next.Broker)) sections.Add("Broker");
        if (Differ(running.Dashboard, next.Dashboard)) sections.Add("Dashboard");
        if (running.DataDir != next.DataDir) sections.Add("DataDir");
        if (Differ(running.Valves, next.Valves)) sections.Add("Valves");
        if (Differ(running.AlarmSystem, next.AlarmSystem)) sections.Add("AlarmSystem");
        return sections;
    }

    private static bool Differ<T>(T a, T b) => JsonSerializer.Serialize(a) != JsonSerializer.Serialize(b);
}

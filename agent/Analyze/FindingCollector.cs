using LoopWatch.Analytics.Findings;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Hears every finding change of the analysis and keeps one entry per occurrence: raised adds it, updated replaces its
/// figures, ended closes it. Ended findings stay, so the report lists what happened as well as what is still active.
/// </summary>
public sealed class FindingCollector
{
    private readonly Dictionary<string, List<Finding>> _byLoop = new(StringComparer.Ordinal);

    /// <summary>Every change heard, in order (raised, updated, ended); useful to compare runs.</summary>
    public long Changes { get; private set; }

    /// <summary>The sink to give the plant state.</summary>
    public void Take(FindingChange change)
    {
        Changes++;
        if (!_byLoop.TryGetValue(change.LoopId, out var list)) _byLoop[change.LoopId] = list = [];
        if (change.Change == FindingChangeKind.Raised) { list.Add(change.Finding); return; }
        for (var i = list.Count - 1; i >= 0; i--)
        {
            if (list[i].Kind != change.Finding.Kind || !list[i].Active) continue;
            list[i] = change.Finding;
            return;
        }
        list.Add(change.Finding);
    }

    /// <summary>The findings of one loop in the order they were raised.</summary>
    public IReadOnlyList<Finding> For(string loopId) => _byLoop.TryGetValue(loopId, out var list) ? list : [];
}

namespace LoopWatch.Analytics.Findings;

/// <summary>The active findings of one loop, one per kind, reporting each change to the loop's sink.</summary>
public sealed class FindingBoard
{
    private readonly string _loopId;
    private readonly Action<FindingChange>? _sink;
    private readonly List<Finding> _active = new(4);

    /// <summary>A board for one loop; <paramref name="sink"/> hears every raise, update and end.</summary>
    public FindingBoard(string loopId, Action<FindingChange>? sink)
    {
        _loopId = loopId;
        _sink = sink;
    }

    /// <summary>The findings active now.</summary>
    public IReadOnlyList<Finding> Active => _active;

    /// <summary>The active finding of a kind, or null.</summary>
    public Finding? Get(string kind)
    {
        foreach (var f in _active) if (f.Kind == kind) return f;
        return null;
    }

    /// <summary>True when a finding of this kind is active.</summary>
    public bool IsActive(string kind) => Get(kind) is not null;

    /// <summary>Raises a finding, or replaces the figures of the active one of the same kind (keeping its start).</summary>
    public void Set(Finding finding)
    {
        for (var i = 0; i < _active.Count; i++)
        {
            if (_active[i].Kind != finding.Kind) continue;
            var kept = finding with { Start = _active[i].Start };
            if (kept == _active[i]) return;
            _active[i] = kept;
            _sink?.Invoke(new FindingChange(_loopId, FindingChangeKind.Updated, kept));
            return;
        }
        _active.Add(finding);
        _sink?.Invoke(new FindingChange(_loopId, FindingChangeKind.Raised, finding));
    }

    /// <summary>Ends the active finding of a kind at <paramref name="end"/>; nothing happens when none is active.</summary>
    public void End(string kind, DateTimeOffset end)
    {
        for (var i = 0; i < _active.Count; i++)
        {
            if (_active[i].Kind != kind) continue;
            var ended = _active[i] with { End = end };
            _active.RemoveAt(i);
            _sink?.Invoke(new FindingChange(_loopId, FindingChangeKind.Ended, ended));
            return;
        }
    }
}

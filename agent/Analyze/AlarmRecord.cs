using LoopWatch.Agent.Alarms;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Every alarm transition the engine made during the analysis (the journal the agent would have written), kept up to
/// <see cref="Limit"/> so memory stays flat; counts go on beyond it.
/// </summary>
public sealed class AlarmRecord : IAlarmSink
{
    /// <summary>Transitions kept per run.</summary>
    public const int Limit = 10_000;

    private readonly List<AlarmTransition> _kept = [];
    private readonly Dictionary<string, int> _activations = new(StringComparer.Ordinal);

    /// <summary>Transitions seen.</summary>
    public long Count { get; private set; }

    /// <summary>The first <see cref="Limit"/> transitions, in order.</summary>
    public IReadOnlyList<AlarmTransition> Transitions => _kept;

    /// <summary>How often each alarm (<c>loop:kind</c>) was activated, that is annunciated to an operator.</summary>
    public IReadOnlyDictionary<string, int> Activations => _activations;

    /// <inheritdoc />
    public void Transitioned(in AlarmTransition transition)
    {
        Count++;
        if (_kept.Count < Limit) _kept.Add(transition);
        if (transition.Trigger == AlarmTrigger.Activate)
            _activations[transition.After.Id] = _activations.GetValueOrDefault(transition.After.Id) + 1;
    }
}

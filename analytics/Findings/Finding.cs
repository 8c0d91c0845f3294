namespace LoopWatch.Analytics.Findings;

/// <summary>
/// Something a detector found on a loop: <see cref="Kind"/> is one of <see cref="FindingKinds"/>, <see cref="End"/> is null while active.
/// Derived records add their figures as properties (snake_case in JSON).
/// </summary>
public abstract record Finding(string Kind, DateTimeOffset Start, DateTimeOffset? End)
{
    /// <summary>True while the condition holds.</summary>
    public bool Active => End is null;

    /// <summary>A one-line explanation for people: what is seen, the likely cause, what to check next.</summary>
    public abstract string Diagnosis { get; }
}

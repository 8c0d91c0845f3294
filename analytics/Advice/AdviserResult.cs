namespace LoopWatch.Analytics.Advice;

/// <summary>
/// What one adviser says about a loop: figures an engineer can act on with a worked explanation, or why nothing is
/// shown. Derived records add their figures as properties (snake_case in JSON).
/// </summary>
public abstract record AdviserResult(DateTimeOffset? At, string? NotShownBecause)
{
    /// <summary>Which adviser: <c>dead-zone</c>, <c>offset-what-if</c> or <c>performance</c>.</summary>
    public abstract string Adviser { get; }

    /// <summary>A short title for pages.</summary>
    public abstract string Title { get; }

    /// <summary>The caution that goes with every piece of advice.</summary>
    public string Caution => AdviceCaution.Text;

    /// <summary>True when figures are shown; false when <see cref="NotShownBecause"/> says why not.</summary>
    public bool Shown => NotShownBecause is null;

    /// <summary>One line for lists such as the weekly summary.</summary>
    public abstract string Headline { get; }

    /// <summary>The working, step by step with the numbers, so a reader can redo it by hand.</summary>
    public abstract IReadOnlyList<string> Explanation { get; }
}

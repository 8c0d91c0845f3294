namespace LoopWatch.Storage.Rows;

/// <summary>
/// A service reset of a final element at <see cref="TimeMs"/>: the current period is closed into history, a new one
/// starts at zero, and a service record is written.
/// </summary>
public readonly record struct ElementReset(string LoopId, string Element, long TimeMs, string User, string? Note);

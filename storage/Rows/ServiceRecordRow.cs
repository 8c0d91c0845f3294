namespace LoopWatch.Storage.Rows;

/// <summary>A maintenance note on a final element. <see cref="Id"/> is assigned by the database (ignored on write).</summary>
public readonly record struct ServiceRecordRow(
    string LoopId,
    string Element,
    long TimeMs,
    string User,
    string? Note,
    long Id = 0);

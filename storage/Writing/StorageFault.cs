namespace LoopWatch.Storage.Writing;

/// <summary>Why the writer cannot write, and since when; cleared when a retry succeeds.</summary>
public sealed record StorageFault(string Text, DateTimeOffset Since);

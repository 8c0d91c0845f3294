namespace LoopWatch.Storage.Schema;

/// <summary>One schema step: applied once, in version order, in its own transaction.</summary>
public readonly record struct Migration(int Version, string Name, string Sql);

namespace LoopWatch.Storage.Schema;

/// <summary>The database schema cannot be used by this build, e.g. it was written by a newer LoopWatch.</summary>
public sealed class StorageSchemaException(string message) : Exception(message);

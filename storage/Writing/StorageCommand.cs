namespace LoopWatch.Storage.Writing;

/// <summary>A queued write (statement and its parameter row), or a flush marker when <see cref="Flushed"/> is set.</summary>
internal readonly record struct StorageCommand(string? Sql, object? Row, TaskCompletionSource? Flushed);

using System.Collections.Concurrent;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Storage.Tests.Support;

/// <summary>Keeps the event ids and levels logged, for checks on the stable ids.</summary>
public sealed class RecordingLogger<T> : ILogger<T>
{
    public ConcurrentQueue<(int EventId, LogLevel Level, string Message)> Entries { get; } = new();

    public IDisposable? BeginScope<TState>(TState state) where TState : notnull => null;

    public bool IsEnabled(LogLevel logLevel) => true;

    public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter) =>
        Entries.Enqueue((eventId.Id, logLevel, formatter(state, exception)));
}

using System.Collections.Concurrent;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Keeps every log line of a host in memory, so a test can wait for the line that proves a behaviour.</summary>
public sealed class LogCapture : ILoggerProvider
{
    private readonly ConcurrentQueue<(int EventId, LogLevel Level, string Message)> _lines = new();

    public IReadOnlyList<(int EventId, LogLevel Level, string Message)> Lines => _lines.ToArray();

    public ILogger CreateLogger(string categoryName) => new Sink(_lines);

    public void Dispose() { }

    private sealed class Sink(ConcurrentQueue<(int, LogLevel, string)> lines) : ILogger
    {
        public IDisposable? BeginScope<TState>(TState state) where TState : notnull => null;
        public bool IsEnabled(LogLevel logLevel) => true;
        public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter) =>
            lines.Enqueue((eventId.Id, logLevel, formatter(state, exception)));
    }
}

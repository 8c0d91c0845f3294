using LoopWatch.Storage;
using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Writing;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Storage;

/// <summary>
/// The agent's database: <c>&lt;DataDir&gt;/loopwatch.db</c> opened (and migrated) on first use, its single writer and a
/// reader. <see cref="CloseAsync"/> flushes the writer and releases the file; it is safe to call twice.
/// </summary>
public sealed class AgentStorage(StorageOptions options, TimeProvider time, ILoggerFactory logs) : IAsyncDisposable
{
    private readonly object _gate = new();
    private LoopWatchDatabase? _database;
    private StorageWriter? _writer;
    private StorageReader? _reader;
    private bool _closed;

    /// <summary>The file name inside the data folder.</summary>
    public const string FileName = "loopwatch.db";

    /// <summary>The open database (opened on first access).</summary>
    public LoopWatchDatabase Database { get { Open(); return _database!; } }

    /// <summary>The writer every producer posts to.</summary>
    public StorageWriter Writer { get { Open(); return _writer!; } }

    /// <summary>Queries on the same file.</summary>
    public StorageReader Reader { get { Open(); return _reader!; } }

    /// <summary>Opens the file and starts the writer; nothing happens when already open.</summary>
    public void Open()
    {
        lock (_gate)
        {
            if (_database is not null) return;
            ObjectDisposedException.ThrowIf(_closed, this);
            _database = LoopWatchDatabase.Open(options, logs.CreateLogger<LoopWatchDatabase>());
            _writer = new StorageWriter(_database, time, logs.CreateLogger<StorageWriter>());
            _reader = new StorageReader(_database);
        }
    }

    /// <summary>Commits what is queued and closes the file.</summary>
    public async Task CloseAsync()
    {
        StorageWriter? writer;
        LoopWatchDatabase? database;
        lock (_gate)
        {
            if (_closed) return;
            _closed = true;
            writer = _writer;
            database = _database;
        }
        if (writer is not null) await writer.DisposeAsync().ConfigureAwait(false);
        database?.Dispose();
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync() => await CloseAsync().ConfigureAwait(false);
}

using System.Threading.Channels;
using LoopWatch.Storage.Rows;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopWatch.Storage.Writing;

/// <summary>
/// The one writer of the database: producers post rows without waiting on the disk, a background task commits them in
/// batches, one transaction each. While the database refuses writes it keeps a bounded backlog, reports a
/// <see cref="Fault"/>, and retries with doubling delays on the injected <see cref="TimeProvider"/>.
/// </summary>
public sealed class StorageWriter : IAsyncDisposable
{
    private readonly StorageOptions _options;
    private readonly LoopWatchDatabase _database;
    private readonly TimeProvider _time;
    private readonly ILogger _logger;
    private readonly Channel<StorageCommand> _queue;
    private readonly List<StorageCommand> _backlog = [];
    private readonly List<TaskCompletionSource> _waitingFlushes = [];
    private readonly CancellationTokenSource _stop = new();
    private readonly TaskCompletionSource _completing = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private bool _completionRetried, _readOnlySeen;
    private readonly Task _run;
    private readonly BatchCommitter _committer;
    private long _queued, _written, _dropped, _rejected, _batches, _failed, _lastBatchTicks;
    private int _backlogCount, _disposed, _flushMarkers;
    private volatile string? _lastError;
    private volatile StorageFault? _fault;

    /// <summary>Starts the writer task on <paramref name="database"/> with its options.</summary>
    public StorageWriter(LoopWatchDatabase database, TimeProvider? time = null, ILogger<StorageWriter>? logger = null)
    {
        ArgumentNullException.ThrowIfNull(database);
        _options = database.Options;
        _database = database;
        _time = time ?? TimeProvider.System;
        _logger = logger ?? (ILogger)NullLogger.Instance;
        _committer = new BatchCommitter(database, _logger);
        _queue = Channel.CreateBounded<StorageCommand>(new BoundedChannelOptions(_options.WriteQueueCapacity)
        {
            FullMode = BoundedChannelFullMode.Wait, // makes TryWrite refuse when full, so posts never block
            SingleReader = true,
            SingleWriter = false,
        });
        _run = Task.Run(RunAsync);
    }

    /// <summary>Raised on the writer's task after each committed batch (for metrics); a handler must be quick and must not throw.</summary>
    public event Action<BatchCommit>? BatchCommitted;

    /// <summary>Null while writes succeed; otherwise what failed and since when.</summary>
    public StorageFault? Fault => _fault;

    /// <summary>Current counters.</summary>
    public StorageWriterCounters Counters
    {
        get
        {
            var backlog = Volatile.Read(ref _backlogCount);
            return new(
                Interlocked.Read(ref _queued), Interlocked.Read(ref _written), Interlocked.Read(ref _dropped),
                Interlocked.Read(ref _rejected),
                Math.Max(0, backlog + _queue.Reader.Count - Volatile.Read(ref _flushMarkers)), backlog, Interlocked.Read(ref _batches), Interlocked.Read(ref _failed),
                _lastError, TimeSpan.FromTicks(Interlocked.Read(ref _lastBatchTicks)));
        }
    }

    /// <summary>Queues an alarm journal row; false when the queue is full or closed (counted as dropped).</summary>
    public bool Post(in AlarmJournalEntry entry) => Enqueue(WriteSql.InsertJournal, entry);

    /// <summary>Queues an upsert of the current alarm state of one (loop, kind).</summary>
    public bool Post(in AlarmStateRow state) => Enqueue(WriteSql.UpsertAlarmState, state);

    /// <summary>Queues an upsert of one loop's hourly statistics.</summary>
    public bool Post(in HourlyStatsRow stats) => Enqueue(WriteSql.UpsertHourlyStats, stats);

    /// <summary>Queues an upsert of an element's counters; ignored when its period started before the stored one.</summary>
    public bool Post(in ElementCounterRow counters) => Enqueue(WriteSql.UpsertCounters, counters);

    /// <summary>Queues a maintenance note.</summary>
    public bool Post(in ServiceRecordRow record) => Enqueue(WriteSql.InsertServiceRecord, record);

    /// <summary>Queues a service reset: closes the element's period into history and starts a new one at zero.</summary>
    public bool Post(in ElementReset reset) => Enqueue(WriteSql.ResetElement, reset);

    /// <summary>Completes when everything posted before the call is committed (waits through a fault).</summary>
    public async Task FlushAsync(CancellationToken cancellationToken = default)
    {
        var flushed = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        // Flush markers sit in the queue but are not rows; Pending leaves them out.
        Interlocked.Increment(ref _flushMarkers);
        try
        {
            await _queue.Writer.WriteAsync(new StorageCommand(null, null, flushed), cancellationToken).ConfigureAwait(false);
        }
        catch (Exception exception) when (exception is ChannelClosedException or OperationCanceledException)
        {
            Interlocked.Decrement(ref _flushMarkers);
            if (exception is OperationCanceledException) throw;
            await _run.WaitAsync(cancellationToken).ConfigureAwait(false);
            return;
        }
        await flushed.Task.WaitAsync(cancellationToken).ConfigureAwait(false);
    }

    /// <summary>
    /// Refuses further posts and waits until everything queued is committed; when <paramref name="cancellationToken"/>
    /// fires first the writer stops and the rest is counted as dropped.
    /// </summary>
    public async Task CompleteAsync(CancellationToken cancellationToken = default)
    {
        _queue.Writer.TryComplete();
        _completing.TrySetResult();
        using (cancellationToken.Register(static s => ((CancellationTokenSource)s!).Cancel(), _stop))
            await _run.ConfigureAwait(false);
    }

    /// <summary>Completes the writer, giving a faulted backlog <see cref="StorageOptions.ShutdownTimeout"/> to get through.</summary>
    public async ValueTask DisposeAsync()
    {
        if (Interlocked.Exchange(ref _disposed, 1) == 1) return;
        using (var timeout = new CancellationTokenSource(_options.ShutdownTimeout, _time))
            await CompleteAsync(timeout.Token).ConfigureAwait(false);
        _stop.Dispose();
    }

    private bool Enqueue(string sql, object row)
    {
        if (_queue.Writer.TryWrite(new StorageCommand(sql, row, null)))
        {
            Interlocked.Increment(ref _queued);
            return true;
        }
        var dropped = Interlocked.Increment(ref _dropped);
        if (dropped == 1 || dropped % 10_000 == 0) StorageWriterLog.Dropped(_logger, dropped);
        return false;
    }

    private async Task RunAsync()
    {
        var reader = _queue.Reader;
        var delay = _options.RetryFirstDelay;
        try
        {
            while (true)
            {
                if (_backlog.Count == 0)
                {
                    ReleaseFlushes();
                    if (!await reader.WaitToReadAsync(_stop.Token).ConfigureAwait(false)) break;
                }
                Drain(reader);
                if (WriteBacklog(delay))
                {
                    delay = _options.RetryFirstDelay;
                    continue;
                }
                await WaitBeforeRetryAsync(delay).ConfigureAwait(false);
                delay = TimeSpan.FromTicks(Math.Min(delay.Ticks * 2, _options.RetryMaxDelay.Ticks));
            }
            ReleaseFlushes();
        }
        catch (OperationCanceledException) when (_stop.IsCancellationRequested)
        {
            var lost = (long)_backlog.Count;
            while (reader.TryRead(out var command))
                if (command.Flushed is null) lost++;
                else
                {
                    Interlocked.Decrement(ref _flushMarkers);
                    _waitingFlushes.Add(command.Flushed);
                }
            _backlog.Clear();
            Volatile.Write(ref _backlogCount, 0);
            Interlocked.Add(ref _dropped, lost);
            if (lost > 0) StorageWriterLog.LostOnShutdown(_logger, lost);
            foreach (var flush in _waitingFlushes) flush.TrySetCanceled();
            _waitingFlushes.Clear();
        }
        finally
        {
            _committer.Dispose();
        }
    }

    // Completion cuts one retry wait short so shutdown tries at once instead of sitting out the backoff.
    private async Task WaitBeforeRetryAsync(TimeSpan delay)
    {
        if (_completionRetried)
        {
            await Task.Delay(delay, _time, _stop.Token).ConfigureAwait(false);
            return;
        }
        using var cancelDelay = CancellationTokenSource.CreateLinkedTokenSource(_stop.Token);
        var waited = Task.Delay(delay, _time, cancelDelay.Token);
        if (await Task.WhenAny(waited, _completing.Task).ConfigureAwait(false) == _completing.Task)
        {
            _completionRetried = true;
            cancelDelay.Cancel();
        }
        else
        {
            await waited.ConfigureAwait(false); // observes cancellation by _stop
        }
    }

    private void ReleaseFlushes()
    {
        foreach (var flush in _waitingFlushes) flush.TrySetResult();
        _waitingFlushes.Clear();
    }

    // Moves queued commands into the backlog; a flush marker waits until everything before it is committed.
    private void Drain(ChannelReader<StorageCommand> reader)
    {
        while (_backlog.Count < _options.BacklogCapacity && reader.TryRead(out var command))
        {
            if (command.Flushed is null)
            {
                _backlog.Add(command);
                continue;
            }
            Interlocked.Decrement(ref _flushMarkers);
            if (_backlog.Count == 0) command.Flushed.TrySetResult();
            else _waitingFlushes.Add(command.Flushed);
        }
        Volatile.Write(ref _backlogCount, _backlog.Count);
    }

    private bool WriteBacklog(TimeSpan retryDelay)
    {
        var done = 0;
        try
        {
            while (done < _backlog.Count)
            {
                var count = Math.Min(_options.BatchSize, _backlog.Count - done);
                WriteBatch(done, count);
                done += count;
            }
            _backlog.Clear();
            Volatile.Write(ref _backlogCount, 0);
            if (_fault is { } fault)
            {
                _fault = null;
                StorageWriterLog.Recovered(_logger, _time.GetUtcNow() - fault.Since);
                if (_readOnlySeen)
                {
                    // Readers that opened the file during the fault hold read-only handles; the next writer must not get one.
                    _readOnlySeen = false;
                    _database.ReleasePooledConnections();
                    StorageWriterLog.WritableAgain(_logger, _database.Path);
                }
            }
            return true;
        }
        catch (Exception exception) when (exception is not OperationCanceledException)
        {
            _backlog.RemoveRange(0, done);
            Volatile.Write(ref _backlogCount, _backlog.Count);
            Interlocked.Increment(ref _failed);
            _lastError = exception.Message;
            // A broken connection, or one SQLite opened read-only, may be the cause; the next attempt opens a fresh one.
            _committer.Reset();
            var text = StorageFault.Describe(exception);
            if (_fault is null)
            {
                _fault = new StorageFault(text, _time.GetUtcNow());
                StorageWriterLog.WriteFailed(_logger, _backlog.Count, retryDelay, exception.Message, exception);
            }
            else
            {
                // The cause can change during a fault (a refused -wal write, then a file opened read-only): show the latest.
                if (_fault.Text != text) _fault = _fault with { Text = text };
                StorageWriterLog.StillFailing(_logger, _backlog.Count, retryDelay, exception.Message);
            }
            if (!_readOnlySeen && StorageFault.IsReadOnly(exception))
            {
                _readOnlySeen = true;
                StorageWriterLog.ReadOnly(_logger, _database.Path, _backlog.Count, exception.Message);
            }
            return false;
        }
    }

    private void WriteBatch(int start, int count)
    {
        var began = _time.GetTimestamp();
        var rejected = _committer.Commit(_backlog, start, count);
        if (rejected > 0)
        {
            Interlocked.Add(ref _rejected, rejected);
            _lastError = _committer.LastRejection;
        }
        Interlocked.Add(ref _written, count - rejected);
        Interlocked.Increment(ref _batches);
        var took = _time.GetElapsedTime(began);
        Interlocked.Exchange(ref _lastBatchTicks, took.Ticks);
        // The batch is committed: an observer's fault must not make it look failed (a retry would write it twice).
        try { BatchCommitted?.Invoke(new BatchCommit(count, took)); }
        catch (Exception exception) { _lastError = $"batch observer: {exception.Message}"; }
    }
}

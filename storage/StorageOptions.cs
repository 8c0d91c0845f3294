namespace LoopWatch.Storage;

/// <summary>
/// Where the database lives and how the writer and retention behave.
/// Defaults: <see cref="DatabasePath"/> "data/loopwatch.db", <see cref="RetentionDays"/> 400,
/// <see cref="WriteQueueCapacity"/> 100,000, <see cref="BatchSize"/> 2,000, <see cref="BacklogCapacity"/> 100,000,
/// <see cref="BusyTimeout"/> 5 s, <see cref="RetryFirstDelay"/> 1 s, <see cref="RetryMaxDelay"/> 60 s,
/// <see cref="ShutdownTimeout"/> 10 s.
/// </summary>
public sealed record StorageOptions
{
    /// <summary>SQLite file; its folder is created when missing. Default "data/loopwatch.db".</summary>
    public string DatabasePath { get; init; } = "data/loopwatch.db";

    /// <summary>Hourly statistics and alarm journal rows older than this many days are pruned. Default 400 (a year plus a month for year-on-year comparison).</summary>
    public int RetentionDays { get; init; } = 400;

    /// <summary>
    /// Bounded queue between producers and the writer task; a post to a full queue is refused and counted as dropped.
    /// Default 100,000: at roughly 300 bytes a command that is about 30 MB at worst, and hours of hourly rows, alarm
    /// transitions and counter updates for a few thousand loops while the disk is stalled.
    /// </summary>
    public int WriteQueueCapacity { get; init; } = 100_000;

    /// <summary>Most commands committed in one transaction. Default 2,000.</summary>
    public int BatchSize { get; init; } = 2_000;

    /// <summary>Most commands held by the writer while the database refuses writes; beyond it the queue fills and posts are dropped. Default 100,000.</summary>
    public int BacklogCapacity { get; init; } = 100_000;

    /// <summary>How long a statement waits on a locked database before it fails (whole seconds are used by the provider). Default 5 s.</summary>
    public TimeSpan BusyTimeout { get; init; } = TimeSpan.FromSeconds(5);

    /// <summary>First wait before a failed batch is retried; doubles each failure up to <see cref="RetryMaxDelay"/>. Default 1 s.</summary>
    public TimeSpan RetryFirstDelay { get; init; } = TimeSpan.FromSeconds(1);

    /// <summary>Longest wait between retries. Default 60 s.</summary>
    public TimeSpan RetryMaxDelay { get; init; } = TimeSpan.FromSeconds(60);

    /// <summary>How long disposing the writer keeps retrying a faulted backlog before it gives up and counts it dropped. Default 10 s.</summary>
    public TimeSpan ShutdownTimeout { get; init; } = TimeSpan.FromSeconds(10);
}

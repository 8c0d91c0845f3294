using Microsoft.Extensions.Logging;

namespace LoopWatch.Storage.Writing;

/// <summary>Log messages of <see cref="StorageWriter"/>; event ids are stable.</summary>
internal static partial class StorageWriterLog
{
    [LoggerMessage(EventId = 5011, Level = LogLevel.Error,
        Message = "Storage write failed, keeping {Backlog} commands and retrying in {Delay}: {Error}")]
    public static partial void WriteFailed(ILogger logger, int backlog, TimeSpan delay, string error, Exception exception);

    [LoggerMessage(EventId = 5012, Level = LogLevel.Debug,
        Message = "Storage write still failing, {Backlog} commands kept, next retry in {Delay}: {Error}")]
    public static partial void StillFailing(ILogger logger, int backlog, TimeSpan delay, string error);

    [LoggerMessage(EventId = 5013, Level = LogLevel.Information,
        Message = "Storage writes recovered after {Duration}")]
    public static partial void Recovered(ILogger logger, TimeSpan duration);

    [LoggerMessage(EventId = 5014, Level = LogLevel.Warning,
        Message = "Storage write queue full, {Dropped} commands dropped so far")]
    public static partial void Dropped(ILogger logger, long dropped);

    [LoggerMessage(EventId = 5015, Level = LogLevel.Error,
        Message = "Storage writer stopped with {Lost} commands unwritten")]
    public static partial void LostOnShutdown(ILogger logger, long lost);

    [LoggerMessage(EventId = 5001, Level = LogLevel.Warning,
        Message = "Database {Path} is read-only, keeping {Backlog} commands; the writer reopens it at each retry and writes them once it is writable: {Error}")]
    public static partial void ReadOnly(ILogger logger, string path, int backlog, string error);

    [LoggerMessage(EventId = 5002, Level = LogLevel.Information,
        Message = "Database {Path} writable again; pooled connections opened while it was read-only are dropped, so none of them is used to write")]
    public static partial void WritableAgain(ILogger logger, string path);

    [LoggerMessage(EventId = 5016, Level = LogLevel.Error,
        Message = "Storage rejected a {RowType} for its values, left out of the batch: {Error}")]
    public static partial void RowRejected(ILogger logger, string rowType, string error);
}

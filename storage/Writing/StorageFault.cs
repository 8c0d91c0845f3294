namespace LoopWatch.Storage.Writing;

/// <summary>Why the writer cannot write, and since when; cleared when a retry succeeds.</summary>
public sealed record StorageFault(string Text, DateTimeOffset Since)
{
    // SQLite result codes (SQLite docs, "Result and Error Codes"): READONLY 8, FULL 13.
    internal const int ReadOnly = 8, Full = 13;

    /// <summary>The fault text for a failed write: SQLite's message, named in plain words where the code says what it is.</summary>
    internal static string Describe(Exception exception) => exception switch
    {
        Microsoft.Data.Sqlite.SqliteException { SqliteErrorCode: ReadOnly } => $"database is read-only: {exception.Message}",
        Microsoft.Data.Sqlite.SqliteException { SqliteErrorCode: Full } => $"disk full: {exception.Message}",
        _ => exception.Message,
    };

    internal static bool IsReadOnly(Exception exception) => exception is Microsoft.Data.Sqlite.SqliteException { SqliteErrorCode: ReadOnly };
}

using Microsoft.Data.Sqlite;

namespace LoopWatch.Storage.Writing;

/// <summary>Tells errors caused by one row's values (retrying cannot help) from errors of the database itself.</summary>
internal static class BadRow
{
    // SQLite result codes (SQLite docs, "Result and Error Codes"): TOOBIG 18, CONSTRAINT 19, MISMATCH 20, RANGE 25.
    private const int TooBig = 18, Constraint = 19, Mismatch = 20, Range = 25;

    public static bool IsRowError(Exception exception) => exception is SqliteException { SqliteErrorCode: TooBig or Constraint or Mismatch or Range }
        or InvalidCastException or NotSupportedException or ArgumentException;
}

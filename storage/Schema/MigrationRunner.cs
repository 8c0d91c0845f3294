using System.Globalization;
using Dapper;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Storage.Schema;

/// <summary>Brings a database up to the latest known schema version, refusing one from a newer build.</summary>
internal static partial class MigrationRunner
{
    private const string CreateHistory = """
        CREATE TABLE IF NOT EXISTS schema_migrations (
            version     INTEGER PRIMARY KEY,
            name        TEXT    NOT NULL,
            applied_ms  INTEGER NOT NULL
        ) STRICT;
        """;

    /// <summary>Applies every migration above the stored <c>PRAGMA user_version</c>; returns those applied now.</summary>
    public static IReadOnlyList<Migration> Run(
        SqliteConnection connection, string path, IReadOnlyList<Migration> migrations, TimeProvider time, ILogger logger)
    {
        Check(migrations);
        var latest = migrations[^1].Version;
        var stored = UserVersion(connection, null);
        if (stored > latest)
            throw new StorageSchemaException(
                $"Database '{path}' has schema version {stored}, newer than version {latest} known to this LoopWatch build; " +
                "refusing to open it. Run a newer LoopWatch or restore a backup made by this version.");

        connection.Execute(CreateHistory);
        var applied = new List<Migration>();
        foreach (var migration in migrations)
        {
            if (migration.Version <= stored) continue;
            using var tx = connection.BeginTransaction();
            // Re-read inside the write lock: another process may have migrated since we looked.
            if (UserVersion(connection, tx) >= migration.Version) continue;
            connection.Execute(migration.Sql, transaction: tx);
            connection.Execute(
                "INSERT INTO schema_migrations (version, name, applied_ms) VALUES (@Version, @Name, @AppliedMs)",
                new { migration.Version, migration.Name, AppliedMs = time.GetUtcNow().ToUnixTimeMilliseconds() }, tx);
            // PRAGMA takes no bound parameters; the value is an integer from code, never user text.
            connection.Execute(
                "PRAGMA user_version = " + migration.Version.ToString(CultureInfo.InvariantCulture), transaction: tx);
            tx.Commit();
            applied.Add(migration);
            LogApplied(logger, migration.Version, migration.Name, path);
        }
        return applied;
    }

    private static int UserVersion(SqliteConnection connection, SqliteTransaction? tx) =>
        connection.ExecuteScalar<int>("PRAGMA user_version", transaction: tx);

    private static void Check(IReadOnlyList<Migration> migrations)
    {
        if (migrations.Count == 0) throw new ArgumentException("At least one migration is needed.", nameof(migrations));
        for (var i = 0; i < migrations.Count; i++)
            if (migrations[i].Version != i + 1)
                throw new ArgumentException(
                    $"Migration versions must run 1, 2, 3 … without gaps; position {i} has {migrations[i].Version}.",
                    nameof(migrations));
    }

    [LoggerMessage(EventId = 5110, Level = LogLevel.Information, Message = "Applied schema migration {Version} ({Name}) to {Path}")]
    private static partial void LogApplied(ILogger logger, int version, string name, string path);
}

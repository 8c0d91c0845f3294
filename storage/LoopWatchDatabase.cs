using System.Globalization;
using Dapper;
using LoopWatch.Storage.Schema;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopWatch.Storage;

/// <summary>
/// The LoopWatch SQLite file: created when missing, set to WAL with synchronous=NORMAL, migrated to the latest schema on open.
/// Hand out connections with <see cref="OpenConnection"/>; dispose to release pooled file handles.
/// </summary>
public sealed class LoopWatchDatabase : IDisposable
{
    private readonly string _connectionString;
    private readonly string _writerConnectionString;
    private readonly string _connectionPragmas;

    private LoopWatchDatabase(StorageOptions options, string fullPath, bool readOnly = false)
    {
        Options = options;
        Path = fullPath;
        _connectionString = new SqliteConnectionStringBuilder
        {
            DataSource = fullPath,
            Mode = readOnly ? SqliteOpenMode.ReadOnly : SqliteOpenMode.ReadWriteCreate,
            Cache = SqliteCacheMode.Private,
            Pooling = true,
            ForeignKeys = true,
            DefaultTimeout = Math.Max(1, (int)Math.Ceiling(options.BusyTimeout.TotalSeconds)),
        }.ToString();
        // SQLite opens a file it may not write read-only and stays so; outside the pool, a dropped writer connection
        // really closes and the next one sees the file as it is now.
        _writerConnectionString = new SqliteConnectionStringBuilder(_connectionString) { Pooling = false }.ToString();
        // synchronous and busy_timeout are per connection, so every opened connection gets them.
        _connectionPragmas = "PRAGMA synchronous = NORMAL; PRAGMA busy_timeout = " +
            ((long)options.BusyTimeout.TotalMilliseconds).ToString(CultureInfo.InvariantCulture) + ";";
    }

    /// <summary>Full path of the database file.</summary>
    public string Path { get; }

    /// <summary>The options the database was opened with.</summary>
    public StorageOptions Options { get; }

    /// <summary>Schema version after opening (<c>PRAGMA user_version</c>).</summary>
    public int SchemaVersion { get; private set; }

    /// <summary>Migrations applied by this open; empty when the file was already current.</summary>
    public IReadOnlyList<Migration> AppliedOnOpen { get; private set; } = [];

    /// <summary>Opens or creates the database at <paramref name="path"/> with default options.</summary>
    public static LoopWatchDatabase Open(string path, ILogger<LoopWatchDatabase>? logger = null) =>
        Open(new StorageOptions { DatabasePath = path }, logger);

    /// <summary>Opens or creates the database at <see cref="StorageOptions.DatabasePath"/> and applies pending migrations.</summary>
    /// <exception cref="StorageSchemaException">The file was written by a newer schema than this build knows.</exception>
    /// <exception cref="IOException">SQLite could not open or migrate the file (e.g. it or its folder is read-only); the message says what to do.</exception>
    public static LoopWatchDatabase Open(StorageOptions options, ILogger<LoopWatchDatabase>? logger = null) =>
        Open(options, SchemaMigrations.All, TimeProvider.System, logger);

    internal static LoopWatchDatabase Open(
        StorageOptions options, IReadOnlyList<Migration> migrations, TimeProvider time, ILogger? logger = null)
    {
        ArgumentNullException.ThrowIfNull(options);
        var fullPath = System.IO.Path.GetFullPath(options.DatabasePath);
        var folder = System.IO.Path.GetDirectoryName(fullPath);
        if (!string.IsNullOrEmpty(folder)) Directory.CreateDirectory(folder);

        return Prepared(new LoopWatchDatabase(options, fullPath), (database, connection) =>
        {
            // journal_mode=WAL is stored in the file, so setting it once here is enough (SQLite docs, "Write-Ahead Logging").
            connection.ExecuteScalar<string>("PRAGMA journal_mode = WAL");
            database.AppliedOnOpen = MigrationRunner.Run(
                connection, fullPath, migrations, time, logger ?? NullLogger.Instance);
            database.SchemaVersion = connection.ExecuteScalar<int>("PRAGMA user_version");
        }, e => OpenFailure(fullPath, e));
    }

    /// <summary>
    /// Opens another agent's database to read it (a shard of the same plant): never created, migrated or written, so
    /// the agent that owns it is not disturbed. Its schema must be this build's.
    /// </summary>
    /// <exception cref="IOException">The file is missing, cannot be read, or is not a LoopWatch database.</exception>
    /// <exception cref="StorageSchemaException">The file's schema is newer or older than this build's.</exception>
    public static LoopWatchDatabase OpenReadOnly(string path)
    {
        var fullPath = System.IO.Path.GetFullPath(path);
        if (!File.Exists(fullPath)) throw new IOException($"database '{fullPath}' not found");
        return Prepared(new LoopWatchDatabase(new StorageOptions { DatabasePath = fullPath }, fullPath, readOnly: true), (database, connection) =>
        {
            var version = connection.ExecuteScalar<int>("PRAGMA user_version");
            var latest = SchemaMigrations.Latest;
            if (version == 0) throw new IOException($"database '{fullPath}' is not a LoopWatch database (no schema version)");
            if (version > latest)
                throw new StorageSchemaException($"Database '{fullPath}' has schema version {version}, newer than version {latest} known to this LoopWatch build.");
            // An older file is migrated by its own agent when it starts; read-only, this build cannot read it reliably.
            if (version < latest)
                throw new StorageSchemaException($"Database '{fullPath}' has schema version {version}, older than version {latest}; upgrade the agent that writes it first.");
            database.SchemaVersion = version;
        }, e => $"database '{fullPath}' cannot be read: {e.Message}");
    }

    // Runs the first connection's work on a new database; on any failure the database is disposed, and a SQLite error
    // becomes an IOException with the caller's words for it.
    private static LoopWatchDatabase Prepared(LoopWatchDatabase database, Action<LoopWatchDatabase, SqliteConnection> prepare,
        Func<SqliteException, string> failure)
    {
        try
        {
            using var connection = database.OpenConnection();
            prepare(database, connection);
            return database;
        }
        catch (SqliteException e)
        {
            database.Dispose();
            throw new IOException(failure(e), e);
        }
        catch
        {
            database.Dispose();
            throw;
        }
    }

    /// <summary>Opens a new pooled connection with the LoopWatch pragmas set; the caller disposes it.</summary>
    public SqliteConnection OpenConnection() => Open(_connectionString);

    /// <summary>Opens the storage writer's own connection, outside the pool, with the LoopWatch pragmas set.</summary>
    internal SqliteConnection OpenWriterConnection() => Open(_writerConnectionString);

    /// <summary>Closes the idle pooled connections of this file; those in use close when they are returned.</summary>
    public void ReleasePooledConnections()
    {
        using var connection = new SqliteConnection(_connectionString);
        SqliteConnection.ClearPool(connection);
    }

    /// <summary>Closes the pooled connections of this file so it can be moved or deleted.</summary>
    public void Dispose() => ReleasePooledConnections();

    // SQLite result code CANTOPEN (SQLite docs, "Result and Error Codes"); READONLY is StorageFault's.
    private const int CantOpen = 14;

    private static string OpenFailure(string path, SqliteException e) => e.SqliteErrorCode switch
    {
        Writing.StorageFault.ReadOnly => $"database '{path}' is read-only and needs a schema migration ({e.Message}); make it writable and start again",
        CantOpen => $"database '{path}' cannot be opened ({e.Message}): SQLite needs to read it and to make its -wal and -shm files " +
            "beside it; make the file and its folder writable (permissions, a read-only mount, the immutable flag) and start again",
        _ => $"database '{path}' cannot be opened: {e.Message}",
    };

    private SqliteConnection Open(string connectionString)
    {
        var connection = new SqliteConnection(connectionString);
        try
        {
            connection.Open();
            connection.Execute(_connectionPragmas);
            return connection;
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }
}

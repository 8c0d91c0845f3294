using Microsoft.Data.Sqlite;

namespace LoopWatch.Storage.Tests.Support;

/// <summary>A fresh temp folder for one test's SQLite files, deleted afterwards.</summary>
public sealed class TempDatabase : IDisposable
{
    public TempDatabase()
    {
        Folder = Path.Combine(Path.GetTempPath(), "loopwatch-storage-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Folder);
    }

    public string Folder { get; }

    /// <summary>Path inside a not-yet-existing subfolder, so opening also checks folder creation.</summary>
    public string DatabasePath => Path.Combine(Folder, "data", "loopwatch.db");

    public StorageOptions Options(Func<StorageOptions, StorageOptions>? change = null)
    {
        var options = new StorageOptions { DatabasePath = DatabasePath };
        return change is null ? options : change(options);
    }

    /// <summary>A plain connection without LoopWatch pragmas, for checks from outside.</summary>
    public SqliteConnection OpenRaw()
    {
        var connection = new SqliteConnection(new SqliteConnectionStringBuilder
        {
            DataSource = DatabasePath, Pooling = false, Mode = SqliteOpenMode.ReadWriteCreate,
        }.ToString());
        connection.Open();
        return connection;
    }

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(Folder, recursive: true); }
        catch (IOException) { }
    }
}

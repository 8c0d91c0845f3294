using Dapper;
using LoopWatch.Storage.Schema;
using LoopWatch.Storage.Tests.Support;

namespace LoopWatch.Storage.Tests.Schema;

public sealed class MigrationTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public void Open_FreshFile_AppliesEveryMigrationAndRecordsLatestVersion()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());

        Assert.True(File.Exists(_temp.DatabasePath)); // the missing "data" folder was created
        Assert.Equal(SchemaMigrations.All, db.AppliedOnOpen);
        using var raw = _temp.OpenRaw();
        // SQLite docs, PRAGMA user_version: an integer stored in the database header, 0 in a new file.
        Assert.Equal(SchemaMigrations.Latest, raw.ExecuteScalar<int>("PRAGMA user_version"));
        Assert.Equal(SchemaMigrations.Latest, db.SchemaVersion);
        var history = raw.Query<(long Version, string Name)>("SELECT version, name FROM schema_migrations ORDER BY version").ToList();
        Assert.Equal(SchemaMigrations.All.Select(m => ((long)m.Version, m.Name)), history);
        var tables = raw.Query<string>("SELECT name FROM sqlite_schema WHERE type = 'table' ORDER BY name").ToList();
        Assert.Equal(
            ["alarm_journal", "alarm_state", "element_counters", "element_periods", "hourly_stats", "schema_migrations",
             "service_records", "users"],
            tables);
    }

    [Fact]
    public void Open_ExistingCurrentFile_RunsNothingAndKeepsRows()
    {
        using (var first = LoopWatchDatabase.Open(_temp.Options()))
        using (var c = first.OpenConnection())
            c.Execute("INSERT INTO users (name, role, password_hash, created_ms) VALUES ('op1', 'operator', 'h', 1)");

        using var again = LoopWatchDatabase.Open(_temp.Options());

        Assert.Empty(again.AppliedOnOpen);
        using var raw = _temp.OpenRaw();
        Assert.Equal(1, raw.ExecuteScalar<int>("SELECT count(*) FROM users WHERE name = 'op1'"));
        Assert.Equal(SchemaMigrations.All.Count, raw.ExecuteScalar<int>("SELECT count(*) FROM schema_migrations"));
    }

    [Fact]
    public void Open_V1FileWithCodeKnowingV2_UpgradesAndKeepsRows()
    {
        var v1 = new[] { new Migration(1, "tank", "CREATE TABLE tank (id INTEGER PRIMARY KEY, tag TEXT NOT NULL)") };
        var v2 = v1.Append(new Migration(2, "tank level", "ALTER TABLE tank ADD COLUMN level_pct REAL")).ToArray();
        using (var old = LoopWatchDatabase.Open(_temp.Options(), v1, TimeProvider.System))
        using (var c = old.OpenConnection())
            c.Execute("INSERT INTO tank (tag) VALUES ('LT-201')");

        using var upgraded = LoopWatchDatabase.Open(_temp.Options(), v2, TimeProvider.System);

        Assert.Equal([v2[1]], upgraded.AppliedOnOpen);
        Assert.Equal(2, upgraded.SchemaVersion);
        using var raw = _temp.OpenRaw();
        Assert.Equal(("LT-201", (double?)null), raw.QuerySingle<(string, double?)>("SELECT tag, level_pct FROM tank"));
        Assert.Equal(2, raw.ExecuteScalar<int>("PRAGMA user_version"));
    }

    [Fact]
    public void Open_FailingMigration_RollsBackThatStepOnly()
    {
        var good = new Migration(1, "tank", "CREATE TABLE tank (id INTEGER PRIMARY KEY)");
        var bad = new Migration(2, "broken", "CREATE TABLE pump (id INTEGER PRIMARY KEY); INSERT INTO no_such_table VALUES (1);");

        Assert.ThrowsAny<Exception>(() => LoopWatchDatabase.Open(_temp.Options(), [good, bad], TimeProvider.System));

        using var raw = _temp.OpenRaw();
        // SQLite docs, "Transactions": DDL is transactional, so the half-run step leaves no pump table behind.
        Assert.Equal(1, raw.ExecuteScalar<int>("PRAGMA user_version"));
        Assert.Equal(0, raw.ExecuteScalar<int>("SELECT count(*) FROM sqlite_schema WHERE name = 'pump'"));
    }

    [Fact]
    public void Open_FileFromNewerBuild_IsRefusedWithClearMessage()
    {
        using (LoopWatchDatabase.Open(_temp.Options())) { }
        using (var raw = _temp.OpenRaw())
            raw.Execute($"PRAGMA user_version = {SchemaMigrations.Latest + 1}");

        var error = Assert.Throws<StorageSchemaException>(() => LoopWatchDatabase.Open(_temp.Options()));

        Assert.Contains($"schema version {SchemaMigrations.Latest + 1}", error.Message);
        Assert.Contains("newer", error.Message);
        using var check = _temp.OpenRaw();
        Assert.Equal(SchemaMigrations.Latest + 1, check.ExecuteScalar<int>("PRAGMA user_version")); // left untouched
    }

    [Fact]
    public void Open_MigrationListWithGap_IsRejected()
    {
        Migration[] gap = [new(1, "a", "SELECT 1"), new(3, "c", "SELECT 1")];
        Assert.Throws<ArgumentException>(() => LoopWatchDatabase.Open(_temp.Options(), gap, TimeProvider.System));
    }

    [Fact]
    public async Task Open_RealV1WithRowsThenV2AddingAColumn_KeepsJournalRows()
    {
        using (var v1 = LoopWatchDatabase.Open(_temp.Options()))
        await using (var writer = new Storage.Writing.StorageWriter(v1))
            for (var i = 0; i < 50; i++) writer.Post(SampleRows.Journal(i));
        var v2 = SchemaMigrations.All
            .Append(new Migration(SchemaMigrations.Latest + 1, "journal source", "ALTER TABLE alarm_journal ADD COLUMN source TEXT"))
            .ToArray();

        using var upgraded = LoopWatchDatabase.Open(_temp.Options(), v2, TimeProvider.System);

        Assert.Equal(v2[^1].Version, upgraded.SchemaVersion);
        using var raw = _temp.OpenRaw();
        Assert.Equal(50, raw.ExecuteScalar<int>("SELECT count(*) FROM alarm_journal WHERE source IS NULL"));
        Assert.Equal(0, raw.ExecuteScalar<int>("SELECT count(*) FROM alarm_journal WHERE figures IS NULL"));
    }
}

using System.Diagnostics;
using System.Net.Http.Json;
using System.Text.Json;
using Dapper;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Storage.Tests.Support;
using Microsoft.Data.Sqlite;
using MQTTnet;
using Xunit.Abstractions;

namespace LoopWatch.Agent.Tests.Storage;

/// <summary>
/// The real agent's database locked by another process, on a full disk and read-only: analysis goes
/// on, /healthz and every page report the fault, the writer holds the rows and writes them when the fault clears.
/// </summary>
public sealed class StorageFaultTests(ITestOutputHelper output)
{
    private const string Id = "FIC-960";
    private static readonly string[] Pages = ["/", "/alarms", "/valves", "/weekly"];

    [Fact]
    public async Task A_database_locked_by_another_process_is_reported_and_the_held_rows_are_written_when_it_is_released()
    {
        var dir = Directory.CreateTempSubdirectory("lw-locked-").FullName;
        await RunFaultAsync(dir,
            fault: () =>
            {
                var holder = new SqliteConnection($"Data Source={Path.Combine(dir, "loopwatch.db")}");
                holder.Open();
                holder.Execute("BEGIN EXCLUSIVE");
                return () => { holder.Execute("ROLLBACK"); holder.Dispose(); };
            });
    }

    [Fact]
    public async Task A_full_disk_is_reported_and_the_held_rows_are_written_when_space_comes_back()
    {
        using var volume = SmallVolume.Mount();
        await RunFaultAsync(volume.Path,
            fault: () =>
            {
                var filler = volume.Fill();
                return () => File.Delete(filler);
            });
    }

    [Fact]
    public async Task A_read_only_database_is_reported_and_the_held_rows_are_written_when_it_is_writable_again()
    {
        var dir = Directory.CreateTempSubdirectory("lw-readonly-").FullName;
        var db = Path.Combine(dir, "loopwatch.db");
        // In WAL mode a commit writes the -wal file first (SQLite docs, "Write-Ahead Logging"); the folder too, so no new
        // file can be made. Not the -shm: SQLite maps it into memory and a write to an immutable mapping is a SIGBUS.
        await RunFaultAsync(dir, fault: () => ImmutableFiles.Set(db, db + "-wal", dir).Dispose, readOnly: true);
    }

    [Fact]
    public async Task An_agent_started_on_a_read_only_database_analyses_reports_it_and_writes_once_it_is_writable()
    {
        var dir = Directory.CreateTempSubdirectory("lw-readonly-start-").FullName;
        var db = Path.Combine(dir, "loopwatch.db");
        long before;
        await using (var first = await StartAsync(dir, FreePort.Next()))
            await StaleCycleAsync(first.Agent, first.Client); // creates the database and journals a few transitions
        SqliteConnection.ClearAllPools();
        await using (var raw = new SqliteConnection($"Data Source={db}"))
            before = raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal");
        SqliteConnection.ClearAllPools();

        // The file alone: a folder SQLite cannot make its -wal and -shm in is a start-up failure (see the next test).
        using var immutable = ImmutableFiles.Set(db);
        await RunFaultAsync(dir, fault: () => immutable.Dispose, readOnly: true, faultBeforeStart: true, journalBefore: before);
    }

    [Fact]
    public async Task An_agent_whose_database_folder_is_read_only_at_start_exits_1_and_says_why()
    {
        var dir = Directory.CreateTempSubdirectory("lw-readonly-folder-").FullName;
        var data = Path.Combine(dir, "data");
        var db = Path.Combine(data, "loopwatch.db");
        await using (var first = await StartAsync(data, FreePort.Next()))
            await StaleCycleAsync(first.Agent, first.Client);
        SqliteConnection.ClearAllPools();
        Assert.False(File.Exists(db + "-wal")); // SQLite removes it when the last connection closes (SQLite docs, "Write-Ahead Logging")
        var config = Path.Combine(dir, "loops.json");
        await File.WriteAllTextAsync(config, ConfigFile.Text(FreePort.Next(), "http://127.0.0.1:0", [TestLoops.Pid(Id)]));

        // Without its -wal and -shm and unable to make them, SQLite cannot even read a WAL database: no alarm state can be
        // restored, so the agent stops with the reason (exit 1, which the systemd unit restarts) instead of running blind.
        using var immutable = ImmutableFiles.Set(db, data);
        await using var agent = AgentProcess.Start(["run", "--config", config, "--data-dir", data], new Dictionary<string, string>());
        Assert.True(await agent.WaitForExitAsync(TimeSpan.FromSeconds(60)), "the agent should stop");
        var stderr = string.Join('\n', agent.Stderr);
        Assert.Equal(1, agent.ExitCode);
        Assert.Contains($"loopwatch: could not start: database '{db}' cannot be opened", stderr);
        Assert.Contains("make the file and its folder writable", stderr);
        Assert.DoesNotContain("Unhandled exception", stderr);

        // Adding a dashboard user to the same read-only database fails the same way: exit 1 and the reason.
        var userErr = new StringWriter();
        Assert.Equal(1, await Cli.RunAsync(["user", "add", "mo", "--role", "operator", "--data-dir", data], new StringWriter(), userErr,
            stdin: new StringReader("long enough pw\n")));
        Assert.StartsWith("loopwatch: could not add user 'mo': ", userErr.ToString());
    }

    [Fact]
    public async Task User_add_on_a_read_only_database_file_exits_1_and_says_why()
    {
        var dir = Directory.CreateTempSubdirectory("lw-readonly-user-").FullName;
        var ok = new StringWriter();
        Assert.Equal(0, await Cli.RunAsync(["user", "add", "ann", "--role", "operator", "--data-dir", dir], ok, new StringWriter(),
            stdin: new StringReader("long enough pw\n")));
        SqliteConnection.ClearAllPools();
        var db = Path.Combine(dir, "loopwatch.db");
        using (ImmutableFiles.Set(db))
        {
            var err = new StringWriter();
            Assert.Equal(1, await Cli.RunAsync(["user", "add", "mo", "--role", "operator", "--data-dir", dir], new StringWriter(), err,
                stdin: new StringReader("long enough pw\n")));
            // SQLite docs, "Result and Error Codes": SQLITE_READONLY, "attempt to write a readonly database".
            Assert.Contains("readonly database", err.ToString());
            SqliteConnection.ClearAllPools();
        }
        await using var raw = new SqliteConnection($"Data Source={db}");
        Assert.Equal(1, raw.ExecuteScalar<long>("SELECT count(*) FROM users"));
    }

    private async Task RunFaultAsync(string dataDir, Func<Action> fault, bool readOnly = false, bool faultBeforeStart = false, long journalBefore = 0)
    {
        var port = FreePort.Next();
        Action? clear = faultBeforeStart ? fault() : null;
        JsonElement? held = null;
        await using var run = await StartAsync(dataDir, port);
        var (agent, client) = run;
        try
        {
            if (!faultBeforeStart)
            {
                await StaleCycleAsync(agent, client); // the database is written before the fault
                clear = fault();
            }
            var transitionsBefore = await TransitionsAsync(agent);

            // Alarm transitions keep coming: the loop goes stale and back while nothing can be written.
            var health = await Eventually.Until(async () => { await StaleCycleAsync(agent, client); return await agent.HealthAsync(); },
                h => h.GetProperty("storage").GetProperty("fault").ValueKind == JsonValueKind.String, TimeSpan.FromSeconds(60), "storage fault on /healthz");
            // A refused -wal write is a plain "disk I/O error"; the writer then reopens the file, SQLite opens it read-only
            // and the fault is named so (SQLITE_READONLY, SQLite docs "Result and Error Codes").
            if (readOnly)
                health = await Eventually.Until(() => agent.HealthAsync(), h => h.GetProperty("storage").GetProperty("fault").GetString()!.StartsWith("database is read-only", StringComparison.Ordinal),
                    TimeSpan.FromSeconds(30), "the fault named read-only");
            Assert.Equal("degraded", health.GetProperty("status").GetString());
            var storage = health.GetProperty("storage");
            Assert.InRange(storage.GetProperty("pending").GetInt64(), 1, 200_000); // queue plus backlog, StorageOptions defaults
            Assert.Equal(0, storage.GetProperty("dropped").GetInt64()); // the backlog is bounded at 100,000 rows, far off here

            // Analysis goes on through the fault: values are taken, the loop's state and its alarms follow them.
            var accepted = health.GetProperty("ingest").GetProperty("accepted").GetInt64();
            await StaleCycleAsync(agent, client);
            health = await agent.HealthAsync();
            Assert.True(health.GetProperty("ingest").GetProperty("accepted").GetInt64() > accepted);
            Assert.True(await TransitionsAsync(agent) > transitionsBefore);
            foreach (var page in Pages)
                Assert.Contains("Storage fault", await agent.Http.GetStringAsync(page));
            held = (await agent.HealthAsync()).GetProperty("storage");
            Assert.Equal(JsonValueKind.String, held.Value.GetProperty("fault").ValueKind);
        }
        finally
        {
            clear?.Invoke();
        }

        var after = await Eventually.Until(() => agent.HealthAsync(),
            h => h.GetProperty("storage").GetProperty("fault").ValueKind == JsonValueKind.Null && h.GetProperty("storage").GetProperty("pending").GetInt64() == 0,
            TimeSpan.FromSeconds(90), "backlog written after the fault cleared");
        Assert.Equal("ok", after.GetProperty("status").GetString());
        foreach (var page in Pages)
            Assert.DoesNotContain("Storage fault", await agent.Http.GetStringAsync(page));

        // Every alarm transition the engine made is in the journal: none lost to the fault.
        var transitions = await TransitionsAsync(agent);
        await using var raw = new SqliteConnection($"Data Source={Path.Combine(dataDir, "loopwatch.db")};Mode=ReadOnly");
        var journal = raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal");
        Assert.Equal(journalBefore + transitions, journal);
        Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
        output.WriteLine($"held {held!.Value.GetProperty("pending").GetInt64()} rows just before the clear, written after it " +
            $"{after.GetProperty("storage").GetProperty("written").GetInt64() - held.Value.GetProperty("written").GetInt64()}, " +
            $"dropped {after.GetProperty("storage").GetProperty("dropped").GetInt64()}, journal {journal} = {journalBefore} + {transitions} transitions");
    }

    private sealed record AgentRun(RunningAgent Agent, IMqttClient Client) : IAsyncDisposable
    {
        public async ValueTask DisposeAsync()
        {
            Client.Dispose();
            await Agent.DisposeAsync();
        }
    }

    private static async Task<AgentRun> StartAsync(string dataDir, int port)
    {
        var loop = TestLoops.Pid(Id);
        loop.Limits = new LimitOptions { StaleSeconds = 2 };
        loop.Alarms = new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 };
        var agent = await RunningAgent.StartAsync([loop], embedded: true, brokerPort: port, dataDir: dataDir);
        var client = new MqttClientFactory().CreateMqttClient();
        try
        {
            await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).Build());
            await agent.UntilSubscribedAsync("subscribed");
        }
        catch
        {
            client.Dispose();
            await agent.DisposeAsync();
            throw;
        }
        return new AgentRun(agent, client);
    }

    private static async Task<int> TransitionsAsync(RunningAgent agent) =>
        (await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all&since=2000-01-01T00:00:00Z")).GetProperty("transitions").GetArrayLength();

    /// <summary>Feeds the loop, waits until it is stale (no data for 2 s), feeds it again and waits until it is not.</summary>
    private static async Task StaleCycleAsync(RunningAgent agent, IMqttClient client)
    {
        await FeedAsync(client);
        await Eventually.Until(() => agent.LoopAsync(Id), l => l!.Value.GetProperty("findings").GetRawText().Contains("stale"), TimeSpan.FromSeconds(20), "stale");
        await FeedAsync(client);
        await Eventually.Until(() => agent.LoopAsync(Id), l => !l!.Value.GetProperty("findings").GetRawText().Contains("stale"), TimeSpan.FromSeconds(20), "fresh");
    }

    private static async Task FeedAsync(IMqttClient client)
    {
        var ts = DateTimeOffset.UtcNow.ToString("O");
        foreach (var (tag, v) in new[] { ("pv", "100"), ("sp", "100"), ("op", "40"), ("mode", "\"auto\"") })
            await client.PublishStringAsync($"test/{Id}/{tag}", $$"""{"value": {{v}}, "timestamp": "{{ts}}"}""");
    }

    /// <summary>A 2 MB tmpfs mounted for one test (needs root, as CI runs); a refused mount fails the test.</summary>
    private sealed class SmallVolume : IDisposable
    {
        private SmallVolume(string path) => Path = path;

        public string Path { get; }

        public static SmallVolume Mount()
        {
            var dir = Directory.CreateTempSubdirectory("lw-tmpfs-").FullName;
            Run("mount", "-t", "tmpfs", "-o", "size=2m", "tmpfs", dir);
            return new SmallVolume(dir);
        }

        /// <summary>Fills the volume to the last byte; returns the filler file.</summary>
        public string Fill()
        {
            var filler = System.IO.Path.Combine(Path, "filler");
            using var f = new FileStream(filler, FileMode.Create, FileAccess.Write, FileShare.None, bufferSize: 1);
            var block = new byte[4096];
            try
            {
                while (true) { f.Write(block); f.Flush(); }
            }
            catch (IOException) { } // no space left on device: full
            return filler;
        }

        public void Dispose()
        {
            SqliteConnection.ClearAllPools(); // pooled connections keep the file open and the volume busy
            Run("umount", Path);
            Directory.Delete(Path);
        }

        private static void Run(string tool, params string[] args)
        {
            using var p = Process.Start(new ProcessStartInfo(tool, args) { RedirectStandardError = true, UseShellExecute = false })!;
            var err = p.StandardError.ReadToEnd();
            p.WaitForExit();
            if (p.ExitCode != 0)
                throw new InvalidOperationException($"{tool} {string.Join(' ', args)} failed ({p.ExitCode}): {err.Trim()}; the disk-fault tests need root (CI runs ./test.sh as root)");
        }
    }
}

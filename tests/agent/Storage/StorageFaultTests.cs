using System.Diagnostics;
using System.Net.Http.Json;
using System.Text.Json;
using Dapper;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using Microsoft.Data.Sqlite;
using MQTTnet;

namespace LoopWatch.Agent.Tests.Storage;

/// <summary>
/// The real agent's database locked by another process and on a full disk: analysis goes
/// on, /healthz and every page report the fault, the writer holds the rows and writes them when the fault clears.
/// </summary>
public sealed class StorageFaultTests
{
    private const string Id = "FIC-960";

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

    private static async Task RunFaultAsync(string dataDir, Func<Action> fault)
    {
        var port = FreePort.Next();
        var loop = TestLoops.Pid(Id);
        loop.Limits = new LimitOptions { StaleSeconds = 2 };
        loop.Alarms = new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 };
        await using var agent = await RunningAgent.StartAsync([loop], embedded: true, brokerPort: port, dataDir: dataDir);
        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).Build());
        await Eventually.Until(async () => (await agent.HealthAsync()).GetProperty("ingest").GetProperty("broker_connected").GetBoolean(), c => c, what: "subscribed");
        await StaleCycleAsync(agent, client); // the database is written before the fault

        var clear = fault();
        try
        {
            // Alarm transitions keep coming: the loop goes stale and back while nothing can be written.
            var health = await Eventually.Until(async () => { await StaleCycleAsync(agent, client); return await agent.HealthAsync(); },
                h => h.GetProperty("storage").GetProperty("fault").ValueKind == JsonValueKind.String, TimeSpan.FromSeconds(60), "storage fault on /healthz");
            Assert.Equal("degraded", health.GetProperty("status").GetString());
            Assert.True(health.GetProperty("storage").GetProperty("pending").GetInt64() > 0);
            Assert.Equal(0, health.GetProperty("storage").GetProperty("dropped").GetInt64()); // the backlog is bounded at 100,000 rows, far off here

            // Analysis goes on through the fault: values are taken, the loop's state follows them.
            var accepted = health.GetProperty("ingest").GetProperty("accepted").GetInt64();
            await StaleCycleAsync(agent, client);
            Assert.True((await agent.HealthAsync()).GetProperty("ingest").GetProperty("accepted").GetInt64() > accepted);
            var page = await agent.Http.GetStringAsync("/");
            Assert.Contains("Storage fault", page);
        }
        finally
        {
            clear();
        }

        var after = await Eventually.Until(() => agent.HealthAsync(),
            h => h.GetProperty("storage").GetProperty("fault").ValueKind == JsonValueKind.Null && h.GetProperty("storage").GetProperty("pending").GetInt64() == 0,
            TimeSpan.FromSeconds(90), "backlog written after the fault cleared");
        Assert.Equal("ok", after.GetProperty("status").GetString());
        Assert.DoesNotContain("Storage fault", await agent.Http.GetStringAsync("/"));

        // Every alarm transition the engine made is in the journal: none lost to the fault.
        var alarms = await agent.Http.GetFromJsonAsync<JsonElement>("/api/alarms?state=all&since=2000-01-01T00:00:00Z");
        var transitions = alarms.GetProperty("transitions").GetArrayLength();
        await using var raw = new SqliteConnection($"Data Source={Path.Combine(dataDir, "loopwatch.db")};Mode=ReadOnly");
        Assert.Equal(transitions, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal"));
        Assert.Equal("ok", raw.ExecuteScalar<string>("PRAGMA integrity_check"));
    }

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

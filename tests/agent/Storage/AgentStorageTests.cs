using Dapper;
using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Tests.Alarms;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Offset;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Storage;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Schema;
using Microsoft.Extensions.Logging.Abstractions;

namespace LoopWatch.Agent.Tests.Storage;

public sealed class AgentStorageTests
{
    [Fact]
    public async Task The_host_opens_the_database_and_closes_it_cleanly_on_stop()
    {
        var port = FreePort.Next();
        var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-960")], embedded: true, brokerPort: port);
        var file = Path.Combine(agent.DataDir, AgentStorage.FileName);
        Assert.True(File.Exists(file));
        await agent.DisposeAsync(); // StopAsync then dispose: must not throw

        using var db = LoopWatchDatabase.Open(file);
        Assert.Equal(SchemaMigrations.Latest, db.SchemaVersion);
        Assert.Empty(db.AppliedOnOpen); // already migrated by the agent
        using var c = db.OpenConnection();
        // SQLite documentation: PRAGMA integrity_check returns the single row "ok" for a sound file.
        Assert.Equal("ok", c.ExecuteScalar<string>("PRAGMA integrity_check"));
    }

    [Fact]
    public async Task Alarm_state_and_shelves_survive_a_restart_through_sqlite()
    {
        var dir = Directory.CreateTempSubdirectory("lw-restore-").FullName;
        var options = new StorageOptions { DatabasePath = Path.Combine(dir, AgentStorage.FileName) };
        var spec = AlarmRig.Spec(alarms: new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 });
        await using (var storage = new AgentStorage(options, TimeProvider.System, NullLoggerFactory.Instance))
        {
            var engine = new AlarmEngine([spec], [new AlarmJournal(storage)]);
            var board = new FindingBoard(spec.Id, null);
            board.Set(new OffsetFinding(new DateTimeOffset(AlarmRig.At(0), TimeSpan.Zero), null, 3, 600, 0, OffsetCauses.NoIntegralAction));
            engine.Loop(spec.Id)!.Evaluate(AlarmRig.At(0), LoopMode.Auto, board);
            Assert.True(engine.Act($"{spec.Id}:sustained-offset", AlarmTrigger.Acknowledge, AlarmRig.At(5), "op.one", "seen").Accepted);
            Assert.True(engine.Act($"{spec.Id}:oscillation", AlarmTrigger.Shelve, AlarmRig.At(6), "op.one", null, AlarmRig.At(3606)).Accepted);
            await storage.Writer.FlushAsync();
        }

        await using var again = new AgentStorage(options, TimeProvider.System, NullLoggerFactory.Instance);
        var restored = new AlarmEngine([spec]);
        await new AlarmRestore(again, restored).StartAsync(default);
        var byKind = restored.Alarms().ToDictionary(a => a.Kind);
        Assert.Equal(AlarmState.Acknowledged, byKind[FindingKinds.SustainedOffset].State);
        Assert.Equal("op.one", byKind[FindingKinds.SustainedOffset].AckedBy);
        Assert.Equal(AlarmState.Shelved, byKind[FindingKinds.Oscillation].State);
        Assert.Equal(AlarmRig.At(3606), byKind[FindingKinds.Oscillation].ShelvedUntilTicks);
        var journal = await again.Reader.ReadJournalAsync(new LoopWatch.Storage.Reading.JournalQuery(0, long.MaxValue, OldestFirst: true));
        Assert.Equal(["normal>unacknowledged", "unacknowledged>acknowledged", "normal>shelved"],
            journal.Select(j => $"{j.FromState}>{j.ToState}"));

        // Still active after restart, the acknowledged alarm does not re-annunciate; once the finding is gone it clears.
        var loop = restored.Loop(spec.Id)!;
        var empty = new FindingBoard(spec.Id, null);
        loop.Evaluate(AlarmRig.At(100), LoopMode.Auto, empty);
        Assert.Equal(AlarmState.Normal, restored.Alarms().Single(a => a.Kind == FindingKinds.SustainedOffset).State);
    }

    [Fact]
    public void Hourly_row_holds_the_hour_means_extremes_and_finding_seconds()
    {
        var spec = AlarmRig.Spec();
        var rows = new List<HourlyStatsRow>();
        var recorder = new HourlyRecorder(spec, () => new LoopStatistics { MeanErrorPct = 0.5, ReversalsPerHour = 41.6 }, rows.Add);
        var board = new FindingBoard(spec.Id, null);
        var pvs = new List<double>();
        for (var s = 0; s < 3600; s++)
        {
            var pv = 100 + 10 * Math.Sin(2 * Math.PI * s / 600.0);
            pvs.Add(pv);
            if (s == 1800) board.Set(new OffsetFinding(new DateTimeOffset(AlarmRig.At(s), TimeSpan.Zero), null, 3, 0, 0, OffsetCauses.NoIntegralAction));
            var mode = s < 600 ? LoopMode.Manual : LoopMode.Auto;
            recorder.Step(new AlignedSample(AlarmRig.At(s), pv, 100, 40 + s % 10, double.NaN, mode, true), board);
        }
        Assert.Empty(rows);
        recorder.Step(new AlignedSample(AlarmRig.At(3600), 100, 100, 40, double.NaN, LoopMode.Auto, true), board);
        var row = Assert.Single(rows);
        Assert.Equal(UnixMsOf(AlarmRig.T0), row.HourMs);
        Assert.Equal(3600, row.Samples);
        // Reference: MathNet.Numerics descriptive statistics over the same values.
        Assert.Equal(MathNet.Numerics.Statistics.Statistics.Mean(pvs), row.PvMean!.Value, 9);
        Assert.Equal(MathNet.Numerics.Statistics.Statistics.Minimum(pvs), row.PvMin!.Value, 9);
        Assert.Equal(MathNet.Numerics.Statistics.Statistics.Maximum(pvs), row.PvMax!.Value, 9);
        Assert.Equal(44.5, row.OpMean!.Value, 9);
        Assert.Equal(1800, row.SecondsOffset);
        Assert.Equal(1800, row.SecondsAnyFinding);
        Assert.Equal(600, row.SecondsManual);
        Assert.Equal(42, row.Reversals);
        Assert.Equal(0.5, row.MeanErrorPct);
    }

    private static long UnixMsOf(long ticks) => (ticks - DateTimeOffset.UnixEpoch.UtcTicks) / TimeSpan.TicksPerMillisecond;
}

using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Writing;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Another agent's database as its own writer leaves it, for the tests of the merged weekly figures.</summary>
public static class ShardDatabase
{
    private const long HourMs = 3_600_000;

    /// <summary>
    /// Writes <paramref name="hours"/> hours of <paramref name="loopId"/> from <paramref name="startMs"/> to a new file
    /// at <paramref name="path"/>; the first <paramref name="offsetHours"/> carry 10 minutes of offset. The file is closed after.
    /// </summary>
    public static async Task WriteAsync(string path, string loopId, long startMs, int hours, int offsetHours)
    {
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        using (var db = LoopWatch.Storage.LoopWatchDatabase.Open(path))
        {
            await using var w = new StorageWriter(db);
            for (var h = 0; h < hours; h++)
            {
                var offset = h < offsetHours ? 600 : 0;
                w.Post(new HourlyStatsRow { LoopId = loopId, HourMs = startMs + h * HourMs, Samples = 3600, SecondsOffset = offset, SecondsAnyFinding = offset });
            }
            await w.FlushAsync();
        }
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
    }
}

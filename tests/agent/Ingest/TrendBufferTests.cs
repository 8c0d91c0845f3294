using LoopWatch.Agent.Ingest;

namespace LoopWatch.Agent.Tests.Ingest;

public class TrendBufferTests
{
    private static readonly long T0 = new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero).UtcTicks;

    [Fact]
    public void Since_PointsInFiveSecondBuckets_GivesEachBucketsArithmeticMean()
    {
        var buffer = new TrendBuffer(TimeSpan.FromSeconds(5), buckets: 12);
        var rng = new Random(7);
        var points = Enumerable.Range(0, 40).Select(i => (Ticks: T0 + i * TimeSpan.TicksPerSecond, Pv: 50 + rng.NextDouble() * 10, Sp: 55.0, Op: rng.NextDouble() * 100)).ToList();
        foreach (var p in points) buffer.Add(p.Ticks, p.Pv, p.Sp, p.Op);

        var trend = buffer.Since(0);

        // The mean of each bucket is the plain arithmetic mean (LINQ Average as the reference).
        var expected = points.GroupBy(p => p.Ticks / TimeSpan.FromSeconds(5).Ticks).ToList();
        Assert.Equal(expected.Count, trend.Count);
        for (var i = 0; i < trend.Count; i++)
        {
            Assert.Equal(expected[i].Key * TimeSpan.FromSeconds(5).Ticks + TimeSpan.FromSeconds(2.5).Ticks, trend[i].Ticks);
            Assert.Equal(expected[i].Average(p => p.Pv), trend[i].Pv, 3);
            Assert.Equal(expected[i].Average(p => p.Op), trend[i].Op, 3);
            Assert.Equal(55.0, trend[i].Sp, 4);
        }
    }

    [Fact]
    public void Add_MoreBucketsThanCapacity_KeepsOnlyTheNewestInTimeOrder()
    {
        var buffer = new TrendBuffer(TimeSpan.FromSeconds(5), buckets: 4);
        for (var i = 0; i < 30; i++) buffer.Add(T0 + i * TimeSpan.TicksPerSecond, i, 0, 0);

        var trend = buffer.Since(0);

        // Seconds 10..29 fill buckets 2..5; only the last four remain: means 12, 17, 22, 27.
        Assert.Equal([12f, 17f, 22f, 27f], trend.Select(p => p.Pv).ToArray());
    }

    [Fact]
    public void Add_PointOlderThanTheBuffer_IsIgnoredAndALatePointInAnEarlierBucketCounts()
    {
        var buffer = new TrendBuffer(TimeSpan.FromSeconds(5), buckets: 4);
        for (var i = 0; i < 20; i++) buffer.Add(T0 + i * TimeSpan.TicksPerSecond, 10, 0, 0);
        buffer.Add(T0 - TimeSpan.TicksPerMinute, 1000, 0, 0); // a whole minute late: its bucket was overwritten long ago
        buffer.Add(T0 + 6 * TimeSpan.TicksPerSecond, 70, 0, 0); // late, but its bucket (5..9 s) is still held

        var trend = buffer.Since(0);

        Assert.Equal(4, trend.Count);
        Assert.Equal(10f, trend[0].Pv);
        Assert.Equal((5 * 10 + 70) / 6f, trend[1].Pv, 3);
        Assert.All(trend.Skip(2), p => Assert.Equal(10f, p.Pv));
    }
}

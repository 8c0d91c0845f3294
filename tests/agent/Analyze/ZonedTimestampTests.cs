using System.Globalization;
using LoopWatch.Agent.Analyze;

namespace LoopWatch.Agent.Tests.Analyze;

public sealed class ZonedTimestampTests
{
    private static long? Reference(string text) =>
        DateTimeOffset.TryParse(text, CultureInfo.InvariantCulture, DateTimeStyles.None, out var t) ? t.UtcTicks : null;

    [Theory]
    [InlineData("2026-03-02T00:00:01Z", "2026-03-02 00:00:01")]
    [InlineData("2026-03-02T00:00:01.5Z", "2026-03-02 00:00:01.5")]
    [InlineData("2026-03-02T01:30:00+01:30", "2026-03-02 00:00:00")]
    [InlineData("2026-03-01T23:00:00-01:00", "2026-03-02 00:00:00")]
    [InlineData("2024-02-29T12:00:00.1234567Z", "2024-02-29 12:00:00.1234567")]
    public void TryParse_ZonedTimes_GiveUtcTicks(string text, string utc)
    {
        // ISO 8601: an offset is local time minus UTC, so UTC = local - offset.
        Assert.True(new ZonedTimestamp().TryParse(text, out var ticks));
        Assert.Equal(DateTime.ParseExact(utc, "yyyy-MM-dd HH:mm:ss.FFFFFFF", CultureInfo.InvariantCulture).Ticks, ticks);
    }

    [Theory]
    [InlineData("2026-03-02T00:00:01")]
    [InlineData("2026-02-30T00:00:01Z")]
    [InlineData("2026-13-02T00:00:01Z")]
    [InlineData("2026-03-02T24:00:01Z")]
    [InlineData("1969-12-31T23:59:59Z")]
    [InlineData("2026-03-02T00:00:01.Z")]
    [InlineData("yesterday")]
    public void TryParse_UnzonedInvalidOrBefore1970_IsRefused(string text) => Assert.False(new ZonedTimestamp().TryParse(text, out _));

    [Fact]
    public void TryParse_RandomTimes_AgreeWithTheFrameworkParser()
    {
        // Reference: DateTimeOffset.TryParse (the general path), on the common form and on forms only it reads.
        var rng = new Random(11);
        string[] zones = ["Z", "+00:00", "+01:00", "-05:30", "+13:45", "-12:00", "+14:00", "z"];
        for (var n = 0; n < 100_000; n++)
        {
            var year = rng.Next(1969, 2100);
            var month = rng.Next(1, 13);
            var day = rng.Next(1, 32);
            var fraction = rng.Next(0, 9) switch { 0 => "", var k => "." + rng.NextInt64(0, 100_000_000).ToString("D8", CultureInfo.InvariantCulture)[..k] };
            var text = $"{year:D4}-{month:D2}-{day:D2}T{rng.Next(0, 24):D2}:{rng.Next(0, 60):D2}:{rng.Next(0, 60):D2}{fraction}{zones[rng.Next(zones.Length)]}";
            var expected = Reference(text) is { } t && t >= DateTimeOffset.UnixEpoch.UtcTicks ? t : (long?)null;
            var ok = new ZonedTimestamp().TryParse(text, out var ticks);
            Assert.True(expected == (ok ? ticks : null), text);
        }
    }
}

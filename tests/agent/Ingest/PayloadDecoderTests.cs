using System.Text;
using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Tests.Ingest;

public sealed class PayloadDecoderTests
{
    private static (RejectReason Reason, DecodedValue Value) D(string payload, TagValueKind kind = TagValueKind.Analog)
    {
        var reason = PayloadDecoder.Decode(Encoding.UTF8.GetBytes(payload), kind, out var value);
        return (reason, value);
    }

    [Theory]
    [InlineData("12.5", 12.5)]
    [InlineData(" -3 ", -3)]
    [InlineData("1e3", 1000)]
    [InlineData("0", 0)]
    public void Decode_PlainNumber_GivesValueWithoutTimestamp(string payload, double expected)
    {
        var (reason, v) = D(payload);
        Assert.Equal(RejectReason.None, reason);
        Assert.Equal(expected, v.Value);
        Assert.Equal(0, v.Ticks);
        Assert.Equal(SampleQuality.Good, v.Quality);
    }

    [Theory]
    [InlineData("true", 1)]
    [InlineData("ON", 1)]
    [InlineData("off", 0)]
    [InlineData("False", 0)]
    public void Decode_BooleanWordsOnBinaryTag_GiveZeroOrOne(string payload, double expected)
    {
        Assert.Equal((RejectReason.None, expected), (D(payload, TagValueKind.Binary).Reason, D(payload, TagValueKind.Binary).Value.Value));
        Assert.Equal(RejectReason.NotANumber, D(payload).Reason);
    }

    [Theory]
    [InlineData("auto", LoopMode.Auto)]
    [InlineData("MANUAL", LoopMode.Manual)]
    [InlineData("cascade", LoopMode.Cascade)]
    [InlineData("{\"value\":\"manual\",\"timestamp\":\"2026-03-02T00:00:01Z\"}", LoopMode.Manual)]
    public void Decode_ModeWords_GiveModeNumbers(string payload, LoopMode expected)
    {
        var (reason, v) = D(payload, TagValueKind.Mode);
        Assert.Equal(RejectReason.None, reason);
        Assert.Equal((double)expected, v.Value);
    }

    [Fact]
    public void Decode_JsonWithTimestampAndQuality_GivesAll()
    {
        var (reason, v) = D("""{"value": 12.3, "timestamp": "2026-03-02T01:00:01+01:00", "quality": "bad", "extra": [1, 2]}""");
        Assert.Equal(RejectReason.None, reason);
        Assert.Equal(12.3, v.Value);
        Assert.Equal(new DateTimeOffset(2026, 3, 2, 0, 0, 1, TimeSpan.Zero).UtcTicks, v.Ticks); // +01:00 offset converted to UTC
        Assert.Equal(SampleQuality.Bad, v.Quality);
    }

    [Theory]
    [InlineData("", RejectReason.Empty)]
    [InlineData("   ", RejectReason.Empty)]
    [InlineData("abc", RejectReason.NotANumber)]
    [InlineData("NaN", RejectReason.NotFinite)]
    [InlineData("Infinity", RejectReason.NotFinite)]
    [InlineData("1e400", RejectReason.NotFinite)]
    [InlineData("{\"value\": \"x\"}", RejectReason.NotANumber)]
    [InlineData("{\"value\": 1", RejectReason.BadJson)]
    [InlineData("{\"value\": 1} trailing", RejectReason.BadJson)]
    [InlineData("{\"timestamp\": \"2026-03-02T00:00:01Z\"}", RejectReason.NotANumber)]
    [InlineData("{\"value\": 1, \"timestamp\": \"2026-03-02T00:00:01\"}", RejectReason.BadTimestamp)]
    [InlineData("{\"value\": 1, \"timestamp\": \"1969-12-31T23:59:59Z\"}", RejectReason.BadTimestamp)]
    [InlineData("{\"value\": 1, \"quality\": \"so-so\"}", RejectReason.BadQuality)]
    [InlineData("{\"a\":{\"b\":{\"c\":{\"d\":{\"e\":1}}}}}", RejectReason.BadJson)]
    [InlineData("{\"value\": true}", RejectReason.NotANumber)]
    public void Decode_BadPayload_IsRejectedWithReason(string payload, RejectReason expected)
    {
        Assert.Equal(expected, D(payload).Reason);
    }

    [Fact]
    public void Decode_PayloadAboveLimit_IsRejectedUnread()
    {
        var big = new byte[PayloadDecoder.MaxPayloadBytes + 1];
        Array.Fill(big, (byte)'1');
        Assert.Equal(RejectReason.TooLarge, PayloadDecoder.Decode(big, TagValueKind.Analog, out _));
    }
}

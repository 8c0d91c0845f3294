using System.Globalization;
using System.Text;
using LoopWatch.Agent.Analyze;
using LoopWatch.Agent.Ingest;

namespace LoopWatch.Agent.Tests.Analyze;

public sealed class PlainNumberTests
{
    private static double Decoder(string text)
    {
        Assert.Equal(RejectReason.None, PayloadDecoder.Decode(Encoding.UTF8.GetBytes(text), TagValueKind.Analog, out var v));
        return v.Value;
    }

    [Theory]
    [InlineData("12.345", 12.345)]
    [InlineData("-0.5", -0.5)]
    [InlineData("50", 50)]
    [InlineData("0.1", 0.1)]
    [InlineData("999999999999999", 999999999999999)]
    [InlineData("0.00000000000001", 1e-14)]
    public void TryParse_PlainDecimal_GivesTheCorrectlyRoundedDouble(string text, double expected)
    {
        // The expected values are C# literals, which the compiler rounds correctly (IEEE 754 round to nearest).
        Assert.True(PlainNumber.TryParse(text, out var v));
        Assert.Equal(BitConverter.DoubleToInt64Bits(expected), BitConverter.DoubleToInt64Bits(v));
    }

    [Theory]
    [InlineData("")]
    [InlineData("-")]
    [InlineData("5.")]
    [InlineData(".5")]
    [InlineData("-0")]
    [InlineData("+1")]
    [InlineData(" 1")]
    [InlineData("1 ")]
    [InlineData("1e3")]
    [InlineData("1.2.3")]
    [InlineData("1,5")]
    [InlineData("1234567890123456")]
    [InlineData("NaN")]
    [InlineData("on")]
    public void TryParse_AnythingElse_IsLeftToThePayloadDecoder(string text) => Assert.False(PlainNumber.TryParse(text, out _));

    [Fact]
    public void TryParse_RandomDecimals_GiveBitForBitThePayloadDecodersValue()
    {
        // Reference: the payload decoder's Utf8Parser, IEEE 754 correctly rounded since .NET Core 3.0; digit runs up to
        // 15 digits with every fraction length cover the rounding cases of the fast path.
        var rng = new Random(17);
        var accepted = 0;
        for (var n = 0; n < 200_000; n++)
        {
            var digits = rng.Next(1, 16);
            var run = new StringBuilder();
            for (var i = 0; i < digits; i++) run.Append((char)('0' + rng.Next(10)));
            var fraction = rng.Next(0, digits);
            var text = fraction == 0 ? run.ToString() : run.ToString(0, digits - fraction) + "." + run.ToString(digits - fraction, fraction);
            if (rng.Next(2) == 0) text = "-" + text;
            if (!PlainNumber.TryParse(text, out var v)) continue;
            accepted++;
            Assert.True(BitConverter.DoubleToInt64Bits(Decoder(text)) == BitConverter.DoubleToInt64Bits(v), text);
        }
        Assert.True(accepted > 190_000, $"only {accepted} accepted");
    }

    [Fact]
    public void TryParse_FormattedDoubles_GiveBitForBitThePayloadDecodersValue()
    {
        var rng = new Random(3);
        string[] formats = ["0.####", "0.###", "F2", "F6", "0.###############"];
        for (var n = 0; n < 50_000; n++)
        {
            var x = (rng.NextDouble() - 0.5) * Math.Pow(10, rng.Next(-3, 8));
            foreach (var f in formats)
            {
                var text = x.ToString(f, CultureInfo.InvariantCulture);
                if (!PlainNumber.TryParse(text, out var v)) continue;
                Assert.True(BitConverter.DoubleToInt64Bits(Decoder(text)) == BitConverter.DoubleToInt64Bits(v), text);
            }
        }
    }
}

using System.Globalization;
using System.Text;
using LoopWatch.Agent.Ingest;

namespace LoopWatch.Agent.Tests.Ingest;

/// <summary>
/// A seeded generator of payloads a broken or hostile gateway might send on an analog tag, each with the outcome the
/// payload rules promise: a rejection reason, or <see cref="RejectReason.None"/> with <see cref="Late"/> when the value
/// is readable but older than the loop's current interval (dropped and counted as late).
/// </summary>
public sealed class HostilePayloads(int seed)
{
    /// <summary>One generated payload and what the agent must make of it.</summary>
    public readonly record struct Case(byte[] Payload, int Length, RejectReason Expected, bool Late, string Kind);

    private readonly Random _random = new(seed);
    private readonly byte[] _huge = MakeHuge();

    /// <summary>Cases on the generator's menu, in the order <see cref="Next"/> picks from.</summary>
    public static readonly string[] Kinds =
    [
        "empty", "too-large", "nested-json", "wrong-type", "not-finite", "beyond-double", "control-characters", "truncated-json",
        "invalid-utf8", "bad-timestamp", "before-1970", "far-future", "bad-quality", "duplicate", "out-of-order",
    ];

    /// <summary>A hostile payload for a tag whose latest good payload, stamped <paramref name="nowTicks"/>, was <paramref name="latest"/>.</summary>
    public Case Next(long nowTicks, string latest)
    {
        var kind = Kinds[_random.Next(Kinds.Length)];
        return kind switch
        {
            "empty" => Text(Pick("", " ", "\r\n\t ", "\n"), RejectReason.Empty, kind),
            // A slice of one preallocated megabyte: 64 KB + 1 byte up to the full 1 MB.
            "too-large" => new Case(_huge, _random.Next(PayloadDecoder.MaxPayloadBytes + 1, _huge.Length + 1), RejectReason.TooLarge, false, kind),
            "nested-json" => Nested(kind),
            "wrong-type" => WrongType(kind),
            "not-finite" => NotFinite(kind),
            "beyond-double" => BeyondDouble(kind),
            "control-characters" => Control(kind),
            "truncated-json" => Text(latest[.._random.Next(1, latest.Length - 1)], RejectReason.BadJson, kind),
            "invalid-utf8" => InvalidUtf8(kind),
            "bad-timestamp" => Stamped(Pick("2026-03-02T00:00:01", "2026-13-45T00:00:00Z", "yesterday", "", "2026-03-02 00:00:01Z",
                "10000-01-01T00:00:00Z", "2026-03-02T25:00:00Z"), RejectReason.BadTimestamp, kind),
            "before-1970" => Stamped(Iso(DateTimeOffset.UnixEpoch.AddSeconds(-1 - _random.NextInt64(0, 60L * 365 * 86400))), RejectReason.BadTimestamp, kind),
            // Beyond the 300 s lead the agent allows by default, up to 70 years ahead.
            "far-future" => Stamped(Iso(new DateTimeOffset(nowTicks, TimeSpan.Zero).AddSeconds(301 + _random.NextInt64(0, 70L * 365 * 86400))),
                RejectReason.FutureTimestamp, kind),
            "bad-quality" => Text(Pick("""{"value":1,"quality":"so-so"}""", """{"value":1,"quality":300}""", """{"value":1,"quality":-1}""",
                """{"value":1,"quality":[192]}""", """{"value":1,"quality":1.5}""", """{"value":1,"quality":null}"""), RejectReason.BadQuality, kind),
            "duplicate" => Text(latest, RejectReason.None, kind),
            // Readable but older than the current interval, with a value that would show if it were used.
            "out-of-order" => OutOfOrder(nowTicks, kind),
            _ => throw new InvalidOperationException(kind),
        };
    }

    /// <summary>Random bytes, sometimes a good payload with bytes flipped, inserted or cut: the outcome is whatever the rules say.</summary>
    public byte[] Noise(string good)
    {
        if (_random.Next(3) == 0)
        {
            var bytes = Encoding.UTF8.GetBytes(good).ToList();
            for (var i = _random.Next(1, 4); i > 0; i--)
            {
                var at = _random.Next(bytes.Count);
                switch (_random.Next(3))
                {
                    case 0: bytes[at] = (byte)_random.Next(256); break;
                    case 1: bytes.Insert(at, (byte)_random.Next(256)); break;
                    default: bytes.RemoveAt(at); break;
                }
            }
            return bytes.ToArray();
        }
        var noise = new byte[_random.Next(0, 200)];
        _random.NextBytes(noise);
        return noise;
    }

    private Case OutOfOrder(long nowTicks, string kind)
    {
        var stamp = Iso(new DateTimeOffset(nowTicks, TimeSpan.Zero).AddSeconds(-_random.Next(1, 3600)));
        var bytes = Utf8($$"""{"value":{{Pick("0", "1e6", "-500", "99999")}},"timestamp":"{{stamp}}"}""");
        return new Case(bytes, bytes.Length, RejectReason.None, true, kind);
    }

    private Case Nested(string kind)
    {
        var depth = _random.Next(8, 5000);
        var open = _random.Next(2) == 0 ? "[" : "{\"a\":";
        var close = open == "[" ? "]" : "}";
        return Text($"{{\"value\":{string.Concat(Enumerable.Repeat(open, depth))}1{string.Concat(Enumerable.Repeat(close, depth))}}}", RejectReason.BadJson, kind);
    }

    private Case WrongType(string kind) => Text(Pick("""{"value":"abc"}""", """{"value":null}""", """{"value":[1,2]}""", """{"value":{"v":1}}""",
        """{"value":true}""", "true", "off", "auto", "\"12\"", "{}", """{"val":1}""", "[1]", "0x1F", "12,5", "1.2.3", "--1"), RejectReason.NotANumber, kind);

    private Case NotFinite(string kind) => Text(Pick("NaN", "nan", "Infinity", "-Infinity", "+infinity", """{"value":"NaN"}""", """{"value":"-Infinity"}"""),
        RejectReason.NotFinite, kind);

    private Case BeyondDouble(string kind)
    {
        var exponent = _random.Next(309, 100_000).ToString(CultureInfo.InvariantCulture);
        var sign = _random.Next(2) == 0 ? "" : "-";
        var digits = sign + "1" + new string('0', _random.Next(309, 2000));
        return Text(Pick($"{sign}1e{exponent}", digits, $$"""{"value":{{sign}}1e{{exponent}}}""", $$"""{"value":{{digits}}}""", $$"""{"value":"{{sign}}1e{{exponent}}"}"""),
            RejectReason.NotFinite, kind);
    }

    private Case Control(string kind)
    {
        var c = (char)_random.Next(0, 32);
        if (c is ' ' or '\t' or '\r' or '\n') c = '\u0001';
        // Raw control characters inside a JSON string break the JSON; in a plain payload they make it no number.
        return _random.Next(2) == 0
            ? Text($"12{c}5", RejectReason.NotANumber, kind)
            : Text($"{{\"value\":\"1{c}\"}}", RejectReason.BadJson, kind);
    }

    private Case InvalidUtf8(string kind)
    {
        // The JSON reader does not validate a string it is not asked to convert; the value is no number either way.
        byte[] bytes = [.. "{\"value\":\""u8, 0xFF, 0xFE, (byte)'1', .. "\"}"u8];
        return new Case(bytes, bytes.Length, RejectReason.NotANumber, false, kind);
    }

    private Case Stamped(string timestamp, RejectReason expected, string kind) =>
        Text($$"""{"value":50,"timestamp":"{{timestamp}}"}""", expected, kind);

    private Case Text(string text, RejectReason expected, string kind)
    {
        var bytes = Utf8(text);
        return new Case(bytes, bytes.Length, expected, false, kind);
    }

    private string Pick(params string[] options) => options[_random.Next(options.Length)];

    private static byte[] Utf8(string s) => Encoding.UTF8.GetBytes(s);

    /// <summary>ISO 8601 with Z, as gateways send it.</summary>
    public static string Iso(DateTimeOffset t) => t.UtcDateTime.ToString("yyyy-MM-ddTHH:mm:ss.fffZ", CultureInfo.InvariantCulture);

    private static byte[] MakeHuge()
    {
        var huge = new byte[1024 * 1024];
        Array.Fill(huge, (byte)'7');
        return huge;
    }
}

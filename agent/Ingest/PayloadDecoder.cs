using System.Buffers.Text;
using System.Text.Json;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// Turns an MQTT payload into a value. Accepted: a plain number; <c>true/false/on/off</c> on output and mode tags;
/// <c>auto/manual/cascade</c> on mode tags; or JSON <c>{"value": 12.3, "timestamp": "2026-03-02T00:00:01Z", "quality": "good"}</c>
/// with timestamp (ISO 8601 with Z or an offset) and quality optional. Anything else is rejected with a reason.
/// </summary>
public static class PayloadDecoder
{
    /// <summary>Payloads above this size are rejected unread.</summary>
    public const int MaxPayloadBytes = 64 * 1024;

    private static readonly JsonReaderOptions ReaderOptions = new() { MaxDepth = 4, CommentHandling = JsonCommentHandling.Disallow };
    private static readonly long Epoch = DateTimeOffset.UnixEpoch.UtcTicks;

    /// <summary>Decodes <paramref name="payload"/> for a tag carrying <paramref name="signal"/> values.</summary>
    public static RejectReason Decode(ReadOnlySpan<byte> payload, TagValueKind signal, out DecodedValue value)
    {
        value = default;
        if (payload.Length > MaxPayloadBytes) return RejectReason.TooLarge;
        var text = payload.Trim(" \t\r\n"u8);
        if (text.IsEmpty) return RejectReason.Empty;
        if (text[0] == (byte)'{') return DecodeJson(text, signal, out value);
        var reason = DecodeScalar(text, signal, out var v);
        if (reason == RejectReason.None) value = new DecodedValue(v, 0, SampleQuality.Good);
        return reason;
    }

    private static RejectReason DecodeScalar(ReadOnlySpan<byte> text, TagValueKind signal, out double v)
    {
        if (Utf8Parser.TryParse(text, out v, out var used) && used == text.Length)
            return double.IsFinite(v) ? RejectReason.None : RejectReason.NotFinite;
        if (signal is TagValueKind.Binary or TagValueKind.Mode)
        {
            if (Is(text, "true"u8) || Is(text, "on"u8)) { v = 1; return RejectReason.None; }
            if (Is(text, "false"u8) || Is(text, "off"u8)) { v = 0; return RejectReason.None; }
        }
        if (signal == TagValueKind.Mode)
        {
            if (Is(text, "auto"u8) || Is(text, "automatic"u8)) { v = (double)LoopMode.Auto; return RejectReason.None; }
            if (Is(text, "manual"u8) || Is(text, "man"u8)) { v = (double)LoopMode.Manual; return RejectReason.None; }
            if (Is(text, "cascade"u8) || Is(text, "cas"u8)) { v = (double)LoopMode.Cascade; return RejectReason.None; }
        }
        v = 0;
        // Utf8Parser does not read "NaN"/"Infinity"; name them so the counters say what came.
        if (Is(text, "nan"u8) || Is(text, "infinity"u8) || Is(text, "-infinity"u8) || Is(text, "+infinity"u8)) return RejectReason.NotFinite;
        return RejectReason.NotANumber;
    }

    private static RejectReason DecodeJson(ReadOnlySpan<byte> json, TagValueKind signal, out DecodedValue value)
    {
        value = default;
        double v = 0;
        var haveValue = false;
        long ticks = 0;
        var quality = SampleQuality.Good;
        try
        {
            var reader = new Utf8JsonReader(json, ReaderOptions);
            if (!reader.Read() || reader.TokenType != JsonTokenType.StartObject) return RejectReason.BadJson;
            while (reader.Read() && reader.TokenType == JsonTokenType.PropertyName)
            {
                if (reader.ValueTextEquals("value"u8))
                {
                    reader.Read();
                    var r = ReadValue(ref reader, signal, out v);
                    if (r != RejectReason.None) return r;
                    haveValue = true;
                }
                else if (reader.ValueTextEquals("timestamp"u8))
                {
                    reader.Read();
                    if (!TryTimestamp(ref reader, out ticks)) return RejectReason.BadTimestamp;
                }
                else if (reader.ValueTextEquals("quality"u8))
                {
                    reader.Read();
                    if (!TryQuality(ref reader, out quality)) return RejectReason.BadQuality;
                }
                else
                {
                    reader.Read();
                    reader.Skip();
                }
            }
            if (reader.TokenType != JsonTokenType.EndObject || reader.Read()) return RejectReason.BadJson;
        }
        catch (JsonException)
        {
            return RejectReason.BadJson;
        }
        if (!haveValue) return RejectReason.NotANumber;
        value = new DecodedValue(v, ticks, quality);
        return RejectReason.None;
    }

    private static RejectReason ReadValue(ref Utf8JsonReader reader, TagValueKind signal, out double v)
    {
        v = 0;
        switch (reader.TokenType)
        {
            case JsonTokenType.Number:
                if (!reader.TryGetDouble(out v)) return RejectReason.NotANumber;
                return double.IsFinite(v) ? RejectReason.None : RejectReason.NotFinite;
            case JsonTokenType.True when signal is TagValueKind.Binary or TagValueKind.Mode: v = 1; return RejectReason.None;
            case JsonTokenType.False when signal is TagValueKind.Binary or TagValueKind.Mode: v = 0; return RejectReason.None;
            case JsonTokenType.String:
                if (reader.ValueIsEscaped || reader.HasValueSequence) return RejectReason.NotANumber;
                return DecodeScalar(reader.ValueSpan, signal, out v);
            default:
                if (reader.TokenType is JsonTokenType.StartObject or JsonTokenType.StartArray) reader.Skip();
                return RejectReason.NotANumber;
        }
    }

    private static bool TryTimestamp(ref Utf8JsonReader reader, out long ticks)
    {
        ticks = 0;
        if (reader.TokenType != JsonTokenType.String || reader.HasValueSequence) return false;
        var span = reader.ValueSpan;
        // An ISO 8601 time without Z or an offset is ambiguous across plants and daylight saving: refuse it.
        var zoned = span.Length > 6 && (span[^1] is (byte)'Z' or (byte)'z' || (span[^6] is (byte)'+' or (byte)'-' && span[^3] == (byte)':'));
        if (!zoned || !reader.TryGetDateTimeOffset(out var time)) return false;
        ticks = time.UtcTicks;
        return ticks >= Epoch;
    }

    private static bool TryQuality(ref Utf8JsonReader reader, out SampleQuality quality)
    {
        quality = SampleQuality.Good;
        if (reader.TokenType == JsonTokenType.Number && reader.TryGetInt32(out var opc))
        {
            // OPC DA quality byte: 192+ good, 64-191 uncertain, below 64 bad (common practice, no source).
            quality = opc >= 192 ? SampleQuality.Good : opc >= 64 ? SampleQuality.Uncertain : SampleQuality.Bad;
            return opc is >= 0 and <= 255;
        }
        if (reader.TokenType != JsonTokenType.String || reader.HasValueSequence) return false;
        var s = reader.ValueSpan;
        if (Is(s, "good"u8)) quality = SampleQuality.Good;
        else if (Is(s, "uncertain"u8)) quality = SampleQuality.Uncertain;
        else if (Is(s, "bad"u8)) quality = SampleQuality.Bad;
        else return false;
        return true;
    }

    private static bool Is(ReadOnlySpan<byte> text, ReadOnlySpan<byte> lowerWord)
    {
        if (text.Length != lowerWord.Length) return false;
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (c is >= (byte)'A' and <= (byte)'Z') c = (byte)(c | 0x20);
            if (c != lowerWord[i]) return false;
        }
        return true;
    }
}

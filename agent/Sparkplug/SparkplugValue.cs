using System.Text;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Sparkplug.Wire;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Sparkplug;

/// <summary>Reads a metric's value as a loop value, by the data type its birth declared (Sparkplug 3.0, 6.4.16 "Datatypes").</summary>
public static class SparkplugValue
{
    /// <summary>Decodes one metric of type <paramref name="dataType"/> for a tag that carries <paramref name="kind"/> values.</summary>
    public static RejectReason Read(Payload.Types.Metric metric, DataType dataType, TagValueKind kind, out double value, out SampleQuality quality)
    {
        value = double.NaN;
        quality = Quality(metric);
        // 6.4.5 "Metric": is_null says the metric has no value now; it is taken as a bad sample, which the loop counts.
        if (metric.HasIsNull && metric.IsNull) { quality = SampleQuality.Bad; return RejectReason.None; }
        switch (metric.ValueCase)
        {
            case Payload.Types.Metric.ValueOneofCase.IntValue:
                // 6.4.16: the signed types travel in the uint32 field as their two's complement bits.
                value = dataType switch
                {
                    DataType.Int8 => (sbyte)metric.IntValue,
                    DataType.Int16 => (short)metric.IntValue,
                    DataType.Int32 => (int)metric.IntValue,
                    _ => metric.IntValue,
                };
                break;
            case Payload.Types.Metric.ValueOneofCase.LongValue:
                value = dataType == DataType.Int64 ? (long)metric.LongValue : metric.LongValue;
                break;
            case Payload.Types.Metric.ValueOneofCase.FloatValue: value = metric.FloatValue; break;
            case Payload.Types.Metric.ValueOneofCase.DoubleValue: value = metric.DoubleValue; break;
            case Payload.Types.Metric.ValueOneofCase.BooleanValue:
                // The same rule as plain payloads: true/false only on on-off outputs and mode tags.
                if (kind == TagValueKind.Analog) return RejectReason.NotANumber;
                value = metric.BooleanValue ? 1 : 0;
                break;
            case Payload.Types.Metric.ValueOneofCase.StringValue:
                // Text goes through the plain payload rules, so "auto", "manual" or "12.5" read as they do on any topic.
                var reason = PayloadDecoder.Decode(Encoding.UTF8.GetBytes(metric.StringValue), kind, out var decoded);
                if (reason != RejectReason.None) return reason;
                value = decoded.Value;
                break;
            default:
                return RejectReason.NotANumber;
        }
        if (dataType == DataType.DateTime) return RejectReason.NotANumber;
        return double.IsFinite(value) ? RejectReason.None : RejectReason.NotFinite;
    }

    /// <summary>The event time of a metric (UTC ticks): its own timestamp, else the payload's, else 0.</summary>
    public static long Ticks(Payload payload, Payload.Types.Metric metric) =>
        Ticks(metric.HasTimestamp ? metric.Timestamp : payload.HasTimestamp ? payload.Timestamp : 0UL);

    /// <summary>The event time of a payload (UTC ticks), or 0 when it has none.</summary>
    public static long Ticks(Payload payload) => Ticks(payload.HasTimestamp ? payload.Timestamp : 0UL);

    private static long Ticks(ulong ms)
    {
        // 5.1 "Timestamps": milliseconds since the Unix epoch, UTC.
        return ms == 0 || ms > (ulong)DateTimeOffset.MaxValue.ToUnixTimeMilliseconds() ? 0 : DateTimeOffset.UnixEpoch.UtcTicks + (long)ms * TimeSpan.TicksPerMillisecond;
    }

    private static SampleQuality Quality(Payload.Types.Metric metric)
    {
        // 6.4.9 "Quality Codes": a "Quality" property of 192 is good, 0 bad, 500 stale; OPC-style bands otherwise.
        if (metric.Properties is not { } p) return SampleQuality.Good;
        var i = p.Keys.IndexOf("Quality");
        if (i < 0 || i >= p.Values.Count) return SampleQuality.Good;
        var v = p.Values[i];
        long code = v.ValueCase switch
        {
            Payload.Types.PropertyValue.ValueOneofCase.IntValue => (int)v.IntValue,
            Payload.Types.PropertyValue.ValueOneofCase.LongValue => (long)v.LongValue,
            _ => 192,
        };
        return code switch
        {
            500 => SampleQuality.Bad,
            >= 192 and < 256 => SampleQuality.Good,
            >= 64 and < 192 => SampleQuality.Uncertain,
            _ => SampleQuality.Bad,
        };
    }
}

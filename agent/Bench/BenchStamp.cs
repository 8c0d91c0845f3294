using System.Buffers.Binary;

namespace LoopWatch.Agent.Bench;

/// <summary>The 16 bytes of MQTT 5 correlation data on each bench message: sequence number and Stopwatch time of publish.</summary>
internal static class BenchStamp
{
    public const int Length = 16;

    public static void Write(Span<byte> b, long seq, long sentTicks)
    {
        BinaryPrimitives.WriteInt64LittleEndian(b, seq);
        BinaryPrimitives.WriteInt64LittleEndian(b[8..], sentTicks);
    }

    public static bool TryRead(byte[]? b, out long seq, out long sentTicks)
    {
        seq = sentTicks = 0;
        if (b is null || b.Length != Length) return false;
        seq = BinaryPrimitives.ReadInt64LittleEndian(b);
        sentTicks = BinaryPrimitives.ReadInt64LittleEndian(b.AsSpan(8));
        return true;
    }
}

using System.Buffers.Binary;
using System.Net.Sockets;
using System.Text;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// A bare MQTT 5 publisher for the load generator (OASIS MQTT 5.0, sections 3.1 CONNECT and 3.3 PUBLISH): QoS 0
/// PUBLISH packets with correlation data, encoded back to back into one buffer and written with one socket write per
/// batch, so the generator costs little beside the agent it measures. A client library writes each packet on its own.
/// </summary>
internal sealed class WirePublisher : IAsyncDisposable
{
    private readonly TcpClient _tcp = new() { NoDelay = true };
    private NetworkStream? _stream;
    private byte[] _buffer = new byte[1 << 16];
    private int _length;

    /// <summary>Connects with a clean start and no keep-alive, and waits for a successful CONNACK.</summary>
    public async Task ConnectAsync(string host, int port, string clientId, CancellationToken ct)
    {
        await _tcp.ConnectAsync(host, port, ct);
        _stream = _tcp.GetStream();
        var id = Encoding.UTF8.GetBytes(clientId);
        // Variable header: protocol name "MQTT", version 5, flags clean start, keep-alive 0 (off), no properties.
        byte[] header = [0, 4, (byte)'M', (byte)'Q', (byte)'T', (byte)'T', 5, 0x02, 0, 0, 0];
        var remaining = header.Length + 2 + id.Length;
        var packet = new List<byte> { 0x10 };
        AppendVarInt(packet, remaining);
        packet.AddRange(header);
        packet.Add((byte)(id.Length >> 8));
        packet.Add((byte)id.Length);
        packet.AddRange(id);
        await _stream.WriteAsync(packet.ToArray(), ct);
        // CONNACK: type, remaining length (variable byte integer), flags, reason code, properties; read it whole, for
        // unread bytes would make the final close a reset that can discard what the broker has not read yet.
        var first = new byte[1];
        await _stream.ReadExactlyAsync(first, ct);
        int ackLength = 0, shift = 0, digit;
        do
        {
            await _stream.ReadExactlyAsync(first, ct);
            digit = first[0];
            ackLength |= (digit & 0x7F) << shift;
            shift += 7;
        }
        while ((digit & 0x80) != 0 && shift < 28);
        var ack = new byte[ackLength];
        await _stream.ReadExactlyAsync(ack, ct);
        if (ackLength < 2 || ack[1] != 0) throw new InvalidOperationException($"the broker refused the bench publisher (CONNACK reason {(ackLength < 2 ? -1 : ack[1])})");
    }

    /// <summary>Appends one QoS 0 PUBLISH of <paramref name="payload"/> on <paramref name="topic"/> (UTF-8), stamped with sequence and send time.</summary>
    public void Add(ReadOnlySpan<byte> topic, ReadOnlySpan<byte> payload, long seq, long sentTicks)
    {
        const int Properties = 1 + 2 + BenchStamp.Length; // correlation data (0x09): id, two-byte length, data
        var remaining = 2 + topic.Length + 1 + Properties + payload.Length;
        var need = 1 + 4 + remaining;
        if (_length + need > _buffer.Length) Array.Resize(ref _buffer, Math.Max(_buffer.Length * 2, _length + need));
        var b = _buffer.AsSpan(_length);
        var n = 0;
        b[n++] = 0x30;
        n += WriteVarInt(b[n..], remaining);
        BinaryPrimitives.WriteUInt16BigEndian(b[n..], (ushort)topic.Length);
        n += 2;
        topic.CopyTo(b[n..]);
        n += topic.Length;
        b[n++] = Properties;
        b[n++] = 0x09;
        BinaryPrimitives.WriteUInt16BigEndian(b[n..], BenchStamp.Length);
        n += 2;
        BenchStamp.Write(b[n..], seq, sentTicks);
        n += BenchStamp.Length;
        payload.CopyTo(b[n..]);
        n += payload.Length;
        _length += n;
    }

    /// <summary>Writes what was added in one go.</summary>
    public async ValueTask FlushAsync(CancellationToken ct)
    {
        if (_length == 0) return;
        await _stream!.WriteAsync(_buffer.AsMemory(0, _length), ct);
        _length = 0;
    }

    private static int WriteVarInt(Span<byte> b, int value)
    {
        var n = 0;
        do
        {
            var digit = (byte)(value % 128);
            value /= 128;
            b[n++] = value > 0 ? (byte)(digit | 0x80) : digit;
        }
        while (value > 0);
        return n;
    }

    private static void AppendVarInt(List<byte> packet, int value)
    {
        Span<byte> b = stackalloc byte[4];
        var n = WriteVarInt(b, value);
        for (var i = 0; i < n; i++) packet.Add(b[i]);
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        try
        {
            if (_stream is not null)
            {
                await FlushAsync(CancellationToken.None);
                await _stream.WriteAsync(new byte[] { 0xE0, 0x00 }); // DISCONNECT, normal
                // Half-close and wait for the broker to close its side: it has then read every packet written.
                _tcp.Client.Shutdown(SocketShutdown.Send);
                using var wait = new CancellationTokenSource(TimeSpan.FromSeconds(120));
                var sink = new byte[256];
                while (await _stream.ReadAsync(sink, wait.Token) > 0) { }
            }
        }
        catch (OperationCanceledException) { /* the broker never closed: give up waiting */ }
        catch (IOException) { /* the broker may be gone already */ }
        catch (SocketException) { }
        _tcp.Dispose();
    }
}

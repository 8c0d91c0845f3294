using System.Net.Sockets;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>MQTT packets read and written by hand on a socket, for tests that look at the wire itself.</summary>
public static class MqttWire
{
    /// <summary>Reads one whole packet: the fixed header's first byte and the body (OASIS MQTT 3.1.1 and 5.0, section 2.2).</summary>
    public static async Task<(int Type, byte[] Body)> ReadPacketAsync(NetworkStream stream, CancellationToken ct = default)
    {
        var one = new byte[1];
        await stream.ReadExactlyAsync(one, ct);
        var type = one[0];
        int length = 0, shift = 0;
        do
        {
            await stream.ReadExactlyAsync(one, ct);
            length |= (one[0] & 0x7F) << shift;
            shift += 7;
        }
        while ((one[0] & 0x80) != 0);
        var body = new byte[length];
        await stream.ReadExactlyAsync(body, ct);
        return (type, body);
    }

    /// <summary>
    /// Connects as <paramref name="clientId"/> (MQTT 3.1.1 section 3.1: protocol level 4, clean session, keep-alive 60 s)
    /// and checks the CONNACK accepts.
    /// </summary>
    public static async Task ConnectAsync(NetworkStream stream, string clientId)
    {
        var id = System.Text.Encoding.UTF8.GetBytes(clientId);
        byte[] header = [0, 4, (byte)'M', (byte)'Q', (byte)'T', (byte)'T', 4, 0x02, 0, 60, 0, (byte)id.Length];
        await stream.WriteAsync((byte[])[0x10, (byte)(header.Length + id.Length), .. header, .. id]);
        var (type, body) = await ReadPacketAsync(stream);
        Assert.Equal(0x20, type);
        Assert.Equal(0, body[1]); // return code: accepted
    }
}

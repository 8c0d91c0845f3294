using System.Net;
using System.Net.Sockets;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Finds a TCP port free on loopback right now.</summary>
public static class FreePort
{
    public static int Next()
    {
        using var l = new TcpListener(IPAddress.Loopback, 0);
        l.Start();
        return ((IPEndPoint)l.LocalEndpoint).Port;
    }
}

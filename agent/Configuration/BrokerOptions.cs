namespace LoopWatch.Agent.Configuration;

/// <summary>Where the agent reads tags from. With <see cref="Embedded"/> the agent also runs the broker itself, on loopback.</summary>
public sealed class BrokerOptions
{
    /// <summary>Run an MQTT broker inside the agent (MQTTnet.Server); default false for <c>run</c>, true for <c>demo</c>.</summary>
    public bool Embedded { get; set; }

    public string Host { get; set; } = "127.0.0.1";
    public int Port { get; set; } = 1883;
    public string? Username { get; set; }

    /// <summary>Password of <see cref="Username"/>; set it through <c>LOOPWATCH__BROKER__PASSWORD</c> rather than the file. Never logged.</summary>
    public string? Password { get; set; }

    /// <summary>Connect to the broker over TLS; the broker's certificate is always checked (see <see cref="CaFile"/>). Default false.</summary>
    public bool UseTls { get; set; }

    /// <summary>
    /// With <see cref="UseTls"/>: a PEM file of the site's CA certificate(s); the broker's certificate must chain to one of
    /// them. Unset: the operating system's trust store applies.
    /// </summary>
    public string? CaFile { get; set; }

    /// <summary>With <see cref="UseTls"/>: a PEM client certificate for brokers that require one (mutual TLS); needs <see cref="KeyFile"/>.</summary>
    public string? CertFile { get; set; }

    /// <summary>The PEM private key of <see cref="CertFile"/>; its content is never logged (give the path as <c>LOOPWATCH__BROKER__KEYFILE</c> to keep it out of the file).</summary>
    public string? KeyFile { get; set; }

    /// <summary>Password of an encrypted <see cref="KeyFile"/>; set it through <c>LOOPWATCH__BROKER__KEYPASSWORD</c>. Never logged.</summary>
    public string? KeyPassword { get; set; }

    /// <summary>With <see cref="UseTls"/>: the name the broker's certificate must carry when it differs from <see cref="Host"/> (also sent as SNI).</summary>
    public string? TlsServerName { get; set; }

    /// <summary>
    /// Embedded broker: the address it listens on; default 127.0.0.1. Any other address needs <see cref="Username"/> and
    /// <see cref="Password"/>, which the broker then requires of every client.
    /// </summary>
    public string ListenAddress { get; set; } = "127.0.0.1";

    /// <summary>
    /// MQTT keep-alive of the agent's connections in seconds; default 60. The broker ends a connection silent for 1.5
    /// times this, so a short one drops the subscription (and the QoS 0 messages on their way) when the host stalls.
    /// </summary>
    public int KeepAliveSeconds { get; set; } = 60;

    /// <summary>MQTT client id of the agent's subscription.</summary>
    public string ClientId { get; set; } = "loopwatch-agent";

    /// <summary>Embedded broker: messages queued per client before QoS 0 messages are dropped (MQTTnet's default is far lower).</summary>
    public int MaxPendingMessagesPerClient { get; set; } = 1_000_000;

    /// <summary>A payload timestamp more than this many seconds ahead of its receive time is rejected; default 300.</summary>
    public double MaxLeadSeconds { get; set; } = Ingest.PlantClock.DefaultMaxLeadSeconds;
}

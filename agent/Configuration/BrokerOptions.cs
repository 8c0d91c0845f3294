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

    public bool UseTls { get; set; }

    /// <summary>
    /// Embedded broker: the address it listens on; default 127.0.0.1. Any other address needs <see cref="Username"/> and
    /// <see cref="Password"/>, which the broker then requires of every client.
    /// </summary>
    public string ListenAddress { get; set; } = "127.0.0.1";

    /// <summary>MQTT client id of the agent's subscription.</summary>
    public string ClientId { get; set; } = "loopwatch-agent";

    /// <summary>Embedded broker: messages queued per client before QoS 0 messages are dropped (MQTTnet's default is far lower).</summary>
    public int MaxPendingMessagesPerClient { get; set; } = 1_000_000;

    /// <summary>A payload timestamp more than this many seconds ahead of its receive time is rejected; default 300.</summary>
    public double MaxLeadSeconds { get; set; } = Ingest.PlantClock.DefaultMaxLeadSeconds;
}

namespace LoopWatch.Agent.Sparkplug;

/// <summary>One edge node's session as the agent follows it: born or not, birth/death sequence, message sequence, devices.</summary>
public sealed class SparkplugNode(string group, string edgeNode)
{
    public string Group { get; } = group;
    public string EdgeNode { get; } = edgeNode;

    /// <summary>The node's own metrics under the empty key, each device under its id.</summary>
    public Dictionary<string, SparkplugDevice> Devices { get; } = new(StringComparer.Ordinal);

    /// <summary>True between an NBIRTH and an NDEATH.</summary>
    public bool Born { get; set; }

    /// <summary>The bdSeq of the last NBIRTH, or null; an NDEATH with another bdSeq belongs to an older session.</summary>
    public ulong? BirthDeathSeq { get; set; }

    /// <summary>The last message sequence number seen (0-255), or -1 before any.</summary>
    public int LastSeq { get; set; } = -1;

    /// <summary>True once a reason for a rebirth was logged in this session, so a broken node logs once, not per message.</summary>
    public bool OutOfStep { get; set; }

    /// <summary>Wall time (UTC ticks) before which no further rebirth request goes to this node.</summary>
    public long NextRebirthTicks { get; set; }

    /// <summary>The device (or, for a null id, the node's own metrics), created on first use.</summary>
    public SparkplugDevice Device(string? id)
    {
        var key = id ?? "";
        if (!Devices.TryGetValue(key, out var device))
            Devices[key] = device = new SparkplugDevice(id is null ? $"{Group}/{EdgeNode}" : $"{Group}/{EdgeNode}/{id}");
        return device;
    }
}

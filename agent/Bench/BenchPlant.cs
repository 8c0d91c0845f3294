using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// The simulated plant of the bench: <c>n</c> healthy pid flow loops of Quillmoor Works with PV, SP and OP tags, their
/// values for round <c>r</c> (one round = one second of event time) and the JSON payloads the generator sends.
/// </summary>
internal static class BenchPlant
{
    /// <summary>Event time of round 0.</summary>
    public static readonly DateTimeOffset Start = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);

    private static readonly string[] TagNames = ["pv", "sp", "op"];

    /// <summary>The loop id of loop <paramref name="i"/>.</summary>
    public static string Id(int i) => $"FIC-{i:D5}";

    /// <summary>The MQTT topic of tag <paramref name="tag"/> (0 PV, 1 SP, 2 OP) of loop <paramref name="i"/>.</summary>
    public static string Topic(int i, int tag) => $"quillmoor-bench/{Id(i)}/{TagNames[tag]}";

    /// <summary>The loop definitions, as a configuration would give them.</summary>
    public static List<LoopOptions> Loops(int n)
    {
        var list = new List<LoopOptions>(n);
        for (var i = 0; i < n; i++)
            list.Add(new LoopOptions
            {
                Id = Id(i), Description = "Bench flow loop", Area = $"Bench {i % 10}", Kind = "pid", Process = "flow",
                Pv = new SignalOptions { Tag = Topic(i, 0), Min = 0, Max = 200, Unit = "m3/h" },
                Sp = new SignalOptions { Tag = Topic(i, 1) },
                Op = new SignalOptions { Tag = Topic(i, 2) },
            });
        return list;
    }

    /// <summary>
    /// A healthy loop: PV within 0.25 % of span around SP, OP moving less than the reversal deadband, so every
    /// detector runs its full step on each sample without raising findings.
    /// </summary>
    public static double Value(int loop, int tag, long round) => tag switch
    {
        0 => 100 + ((round * 7 + loop) % 11 - 5) * 0.05,
        1 => 100,
        _ => 40 + ((round + loop) % 4) * 0.05,
    };

    /// <summary>Event-time ticks of round <paramref name="round"/>.</summary>
    public static long Ticks(long round) => Start.UtcTicks + round * TimeSpan.TicksPerSecond;

    /// <summary>The payload <c>{"value":V,"timestamp":"..."}</c>.</summary>
    public static byte[] Payload(double value, long round)
    {
        Span<byte> buffer = stackalloc byte[96];
        "{\"value\":"u8.CopyTo(buffer);
        var n = 9;
        value.TryFormat(buffer[n..], out var w, "0.###", System.Globalization.CultureInfo.InvariantCulture);
        n += w;
        ",\"timestamp\":\""u8.CopyTo(buffer[n..]);
        n += 14;
        new DateTimeOffset(Ticks(round), TimeSpan.Zero).TryFormat(buffer[n..], out w, "yyyy-MM-ddTHH:mm:ssZ", System.Globalization.CultureInfo.InvariantCulture);
        n += w;
        "\"}"u8.CopyTo(buffer[n..]);
        n += 2;
        return buffer[..n].ToArray();
    }
}

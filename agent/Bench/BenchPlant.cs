using LoopWatch.Analytics.Configuration;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// The simulated plant of the bench: <c>n</c> healthy pid flow loops of Quillmoor Works with PV, SP and OP tags, their
/// values for round <c>r</c> (one round = one second of event time) and the JSON payloads the generator sends.
/// </summary>
internal static class BenchPlant
{
    /// <summary>
    /// Event time of round 0: three minutes before a full hour, so a run at 1 Hz longer than that includes the
    /// hourly statistics of every loop (computed on the ingest path, written in one batch) and its cost shows in the figures.
    /// </summary>
    public static readonly DateTimeOffset Start = new(2026, 3, 2, 6, 57, 0, TimeSpan.Zero);

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

    /// <summary>The event time of round <paramref name="round"/> as the payload writes it, <c>"2026-03-02T06:00:01Z"</c> with the quotes.</summary>
    public static byte[] Stamp(long round)
    {
        Span<byte> b = stackalloc byte[32];
        b[0] = (byte)'"';
        new DateTimeOffset(Ticks(round), TimeSpan.Zero).TryFormat(b[1..], out var n, "yyyy-MM-ddTHH:mm:ssZ", System.Globalization.CultureInfo.InvariantCulture);
        b[n + 1] = (byte)'"';
        return b[..(n + 2)].ToArray();
    }

    /// <summary>Writes the payload <c>{"value":V,"timestamp":"..."}</c> into <paramref name="b"/>; returns its length.</summary>
    public static int Payload(Span<byte> b, double value, ReadOnlySpan<byte> stamp)
    {
        "{\"value\":"u8.CopyTo(b);
        var n = 9;
        value.TryFormat(b[n..], out var w, "0.###", System.Globalization.CultureInfo.InvariantCulture);
        n += w;
        ",\"timestamp\":"u8.CopyTo(b[n..]);
        n += 13;
        stamp.CopyTo(b[n..]);
        n += stamp.Length;
        b[n++] = (byte)'}';
        return n;
    }
}

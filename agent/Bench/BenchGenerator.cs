using System.Diagnostics;
using System.Text;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// Publishes the bench plant over MQTT (QoS 0, MQTT 5, a sequence number and the publish time in the correlation
/// data) through <see cref="Publishers"/> connections, each owning every n-th loop so each tag's values stay in order:
/// paced to a fixed rate, or flat out while at most <see cref="Window"/> messages are ahead of the consumer.
/// </summary>
internal sealed class BenchGenerator(string host, int port, int loops)
{
    private const int MaxBatch = 2_000;
    private long _seq;
    private long _firstTicks, _lastTicks;

    /// <summary>Publishing connections.</summary>
    public int Publishers { get; init; } = 2;

    /// <summary>Flat out: most messages published and not yet taken by the consumer.</summary>
    public long Window { get; init; } = 100_000;

    /// <summary>Messages published.</summary>
    public long Published => Interlocked.Read(ref _seq);

    /// <summary>Published messages per second of publishing.</summary>
    public double OfferedPerSecond => _lastTicks > _firstTicks ? Published / Stopwatch.GetElapsedTime(_firstTicks, _lastTicks).TotalSeconds : 0;

    /// <summary>Stopwatch time of the first publish.</summary>
    public long FirstTicks => _firstTicks;

    /// <summary>
    /// Publishes for <paramref name="duration"/> at <paramref name="rate"/> updates/s (null: flat out against
    /// <paramref name="consumed"/>); <paramref name="warmedUp"/> gets the first sequence number after the warm-up.
    /// </summary>
    public async Task RunAsync(double? rate, TimeSpan duration, TimeSpan warmUp, Func<long> consumed, Action<long> warmedUp, CancellationToken ct)
    {
        var wires = new List<WirePublisher>();
        try
        {
            for (var p = 0; p < Publishers; p++)
            {
                var w = new WirePublisher();
                wires.Add(w);
                await w.ConnectAsync(host, port, $"loopwatch-bench-gen-{p}-{Guid.NewGuid():N}", ct);
            }
            _firstTicks = Stopwatch.GetTimestamp();
            var endTicks = _firstTicks + (long)(duration.TotalSeconds * Stopwatch.Frequency);
            var warmTicks = _firstTicks + (long)(warmUp.TotalSeconds * Stopwatch.Frequency);
            var warmed = 0;
            void CheckWarm(long now)
            {
                if (now >= warmTicks && Interlocked.Exchange(ref warmed, 1) == 0) warmedUp(Published);
            }
            var share = rate / Publishers;
            await Task.WhenAll(wires.Select((w, p) => Task.Run(() => PublishAsync(w, p, share, endTicks, consumed, CheckWarm, ct), ct)));
            _lastTicks = Stopwatch.GetTimestamp();
        }
        finally
        {
            foreach (var w in wires) await w.DisposeAsync();
        }
    }

    private async Task PublishAsync(WirePublisher wire, int publisher, double? rate, long endTicks, Func<long> consumed, Action<long> checkWarm, CancellationToken ct)
    {
        // This publisher's tags in order: its loops (every n-th), each PV, SP, OP; one pass is one round.
        var owned = new List<(int Loop, int Tag, byte[] Topic)>();
        for (var i = publisher; i < loops; i += Publishers)
            for (var t = 0; t < BenchOptions.TagsPerLoop; t++) owned.Add((i, t, Encoding.UTF8.GetBytes(BenchPlant.Topic(i, t))));
        var payload = new byte[128];
        long sent = 0, round = 0;
        var cursor = 0;
        var stamp = BenchPlant.Stamp(0);
        while (!ct.IsCancellationRequested)
        {
            var now = Stopwatch.GetTimestamp();
            if (now >= endTicks) return;
            checkWarm(now);
            var allowed = rate is { } r ? (long)(r * (now - _firstTicks) / Stopwatch.Frequency) - sent : Window - (Published - consumed());
            if (allowed <= 0)
            {
                await Task.Delay(1, ct).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
                continue;
            }
            var n = (int)Math.Min(allowed, MaxBatch);
            var seq = Interlocked.Add(ref _seq, n) - n;
            for (var k = 0; k < n; k++)
            {
                var (loop, tag, topic) = owned[cursor];
                var length = BenchPlant.Payload(payload, BenchPlant.Value(loop, tag, round), stamp);
                wire.Add(topic, payload.AsSpan(0, length), seq + k, now);
                if (++cursor == owned.Count)
                {
                    cursor = 0;
                    stamp = BenchPlant.Stamp(++round);
                }
            }
            await wire.FlushAsync(ct);
            sent += n;
        }
    }
}

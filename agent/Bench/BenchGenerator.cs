using System.Buffers;
using System.Diagnostics;
using MQTTnet;
using MQTTnet.Formatter;
using MQTTnet.Protocol;

namespace LoopWatch.Agent.Bench;

/// <summary>
/// Publishes the bench plant over MQTT (QoS 0, MQTT 5, a sequence number and the publish time in the correlation
/// data) through <see cref="Publishers"/> clients, each owning every n-th loop so each tag's values stay in order:
/// paced to a fixed rate, or flat out while at most <see cref="Window"/> messages are ahead of the consumer.
/// </summary>
internal sealed class BenchGenerator(string host, int port, int loops)
{
    private long _seq;
    private long _firstTicks, _lastTicks;

    /// <summary>Publishing clients (one per core is enough to outrun one subscriber).</summary>
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
        var factory = new MqttClientFactory();
        var clients = new List<IMqttClient>();
        try
        {
            for (var p = 0; p < Publishers; p++)
            {
                var c = factory.CreateMqttClient();
                clients.Add(c);
                await c.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer(host, port).WithClientId($"loopwatch-bench-gen-{p}-{Guid.NewGuid():N}")
                    .WithProtocolVersion(MqttProtocolVersion.V500).WithCleanSession().Build(), ct);
            }
            var topics = new string[loops * BenchOptions.TagsPerLoop];
            for (var i = 0; i < loops; i++)
                for (var t = 0; t < BenchOptions.TagsPerLoop; t++) topics[i * BenchOptions.TagsPerLoop + t] = BenchPlant.Topic(i, t);

            _firstTicks = Stopwatch.GetTimestamp();
            var endTicks = _firstTicks + (long)(duration.TotalSeconds * Stopwatch.Frequency);
            var warmTicks = _firstTicks + (long)(warmUp.TotalSeconds * Stopwatch.Frequency);
            var warmed = 0;
            void CheckWarm(long now)
            {
                if (now >= warmTicks && Interlocked.Exchange(ref warmed, 1) == 0) warmedUp(Published);
            }
            var share = rate / Publishers;
            await Task.WhenAll(clients.Select((c, p) => Task.Run(() => PublishAsync(c, p, topics, share, endTicks, consumed, CheckWarm, ct), ct)));
            _lastTicks = Stopwatch.GetTimestamp();
        }
        finally
        {
            foreach (var c in clients)
            {
                try { if (c.IsConnected) await c.DisconnectAsync(new MqttClientDisconnectOptionsBuilder().Build(), CancellationToken.None); }
                catch (Exception) { /* the broker may be gone already */ }
                c.Dispose();
            }
        }
    }

    private async Task PublishAsync(IMqttClient client, int publisher, string[] topics, double? rate, long endTicks,
        Func<long> consumed, Action<long> checkWarm, CancellationToken ct)
    {
        long sent = 0;
        var start = _firstTicks;
        for (long round = 0; ; round++)
        {
            for (var i = publisher; i < loops; i += Publishers)
            {
                for (var t = 0; t < BenchOptions.TagsPerLoop; t++)
                {
                    while (true)
                    {
                        var now = Stopwatch.GetTimestamp();
                        if (now >= endTicks || ct.IsCancellationRequested) return;
                        checkWarm(now);
                        var due = rate is { } r ? sent < r * (now - start) / Stopwatch.Frequency : Published - consumed() < Window;
                        if (due) break;
                        await Task.Delay(1, ct).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
                    }
                    var seq = Interlocked.Increment(ref _seq) - 1;
                    var message = new MqttApplicationMessage
                    {
                        Topic = topics[i * BenchOptions.TagsPerLoop + t],
                        Payload = new ReadOnlySequence<byte>(BenchPlant.Payload(BenchPlant.Value(i, t, round), round)),
                        QualityOfServiceLevel = MqttQualityOfServiceLevel.AtMostOnce,
                        CorrelationData = BenchStamp.Write(seq, Stopwatch.GetTimestamp()),
                    };
                    await client.PublishAsync(message, ct);
                    sent++;
                }
            }
        }
    }
}

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Agent.Ingest;

/// <summary>
/// One loop's live state: its monitor and trend, behind a lock so the dashboard can read while ingest writes. A cell
/// that is not shared (offline analysis, one thread for everything) skips the lock on its per-value paths.
/// </summary>
public sealed class LoopCell
{
    private readonly Lock _gate = new();
    private readonly bool _shared;
    private readonly TrendBuffer _trend = new(TimeSpan.FromSeconds(5));

    /// <summary>
    /// A cell for <paramref name="spec"/>; finding changes go to <paramref name="sink"/>, <paramref name="hooks"/> add detectors;
    /// <paramref name="shared"/> false when a single thread feeds and reads it.
    /// </summary>
    public LoopCell(LoopSpec spec, Action<FindingChange>? sink, LoopHooks? hooks = null, bool shared = true)
    {
        _shared = shared;
        var detectors = new List<LoopDetector>(DetectorSet.For(spec)) { new TrendRecorder(_trend) };
        // The hooks read statistics through the monitor, which exists only after the list is built.
        if (hooks is not null) detectors.AddRange(hooks(spec, () => Monitor!.Statistics()));
        Monitor = new LoopMonitor(spec, sink, detectors);
        Statistics = Monitor.Statistics;
        Reversals = detectors.OfType<Analytics.Reversals.ReversalDetector>().FirstOrDefault();
    }

    /// <summary>The final-element counters of the loop (pid loops); touch only under <see cref="Read{T}"/>.</summary>
    internal Analytics.Reversals.ReversalDetector? Reversals { get; }

    /// <summary>The analytics of the loop; touch only under <see cref="Read{T}"/> or through the cell's methods.</summary>
    internal LoopMonitor Monitor { get; }

    /// <summary>The monitor's statistics as one delegate made once; call only under <see cref="Read{T}"/>.</summary>
    internal Func<LoopStatistics> Statistics { get; }

    /// <summary>The loop's definition.</summary>
    public LoopSpec Spec => Monitor.Spec;

    /// <summary>Takes one tag value.</summary>
    public void Update(Signal signal, long ticks, double value, SampleQuality quality)
    {
        if (!_shared) { Monitor.Update(signal, ticks, value, quality); return; }
        lock (_gate) Monitor.Update(signal, ticks, value, quality);
    }

    /// <summary>The source of one of the loop's tags reported itself offline: the loop is stale at once.</summary>
    public void SourceLost(Signal signal, long ticks, string source)
    {
        lock (_gate) Monitor.SourceLost(signal, ticks, source);
    }

    /// <summary>Moves the loop's clock on (stale detection).</summary>
    public void Advance(long nowTicks)
    {
        if (!_shared) { Monitor.Advance(nowTicks); return; }
        lock (_gate) Monitor.Advance(nowTicks);
    }

    /// <summary>Reads the monitor consistently.</summary>
    public T Read<T>(Func<LoopMonitor, T> read)
    {
        lock (_gate) return read(Monitor);
    }

    /// <summary>Reads the monitor consistently with <paramref name="state"/> passed in, so a static lambda allocates nothing.</summary>
    public T Read<TState, T>(TState state, Func<LoopMonitor, TState, T> read)
    {
        if (!_shared) return read(Monitor, state);
        lock (_gate) return read(Monitor, state);
    }

    /// <summary>The trend since <paramref name="fromTicks"/>.</summary>
    public List<Dashboard.Model.TrendPoint> Trend(long fromTicks)
    {
        lock (_gate) return _trend.Since(fromTicks);
    }
}

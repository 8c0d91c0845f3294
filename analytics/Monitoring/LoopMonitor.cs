using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Quality;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Monitoring;

/// <summary>
/// The analytics state of one loop. Tag values arrive one at a time in event time; they are held and aligned into one
/// <see cref="AlignedSample"/> per sampling interval, which every detector then sees. Not thread-safe: one caller at a time.
/// </summary>
public sealed class LoopMonitor
{
    private readonly LoopDetector[] _detectors;
    private readonly long _periodTicks;
    private readonly long _staleTicks;
    private readonly byte _required;

    private double _pv = double.NaN, _sp = double.NaN, _op = double.NaN, _position = double.NaN;
    private LoopMode _mode = LoopMode.Unknown;
    private bool _pvGood;
    private long _slot = long.MinValue;
    private byte _seen;
    private bool _slotEmitted;
    private long _lastUpdateTicks;
    // Event time of each tag's held value, so an older value of the same interval (reordered or sent again) never replaces a newer one.
    private long _pvTicks, _spTicks, _opTicks, _modeTicks, _positionTicks;
    private long _samples, _bad, _late;
    private byte _lost;

    /// <summary>A monitor for <paramref name="spec"/>; <paramref name="sink"/> hears every finding change.</summary>
    public LoopMonitor(LoopSpec spec, Action<FindingChange>? sink = null, IReadOnlyList<LoopDetector>? detectors = null)
    {
        Spec = spec;
        Board = new FindingBoard(spec.Id, sink);
        _detectors = (detectors ?? DetectorSet.For(spec)).ToArray();
        _periodTicks = Math.Max(1, (long)(spec.Limits.SampleSeconds * TimeSpan.TicksPerSecond));
        _staleTicks = (long)(spec.Limits.StaleSeconds * TimeSpan.TicksPerSecond);
        _required = (byte)(1 << (int)Signal.Pv | 1 << (int)Signal.Op | (spec.SpTag is null ? 0 : 1 << (int)Signal.Sp));
    }

    /// <summary>The loop's checked definition.</summary>
    public LoopSpec Spec { get; }

    /// <summary>The loop's active findings.</summary>
    public FindingBoard Board { get; }

    /// <summary>The latest held values and counters.</summary>
    public LoopSnapshot Snapshot => new(_pv, _sp, _op, _position, _mode, _lastUpdateTicks, _samples, _bad, _late);

    /// <summary>True while the stale finding is active.</summary>
    public bool IsStale => Board.IsActive(FindingKinds.Stale);

    /// <summary>
    /// Takes one tag value at event time <paramref name="ticks"/> (UTC). Values older than the current sampling interval,
    /// or older than the tag's held value, are counted as late and dropped; a later value in the same interval replaces
    /// the held one.
    /// </summary>
    public void Update(Signal signal, long ticks, double value, SampleQuality quality = SampleQuality.Good)
    {
        var slot = ticks / _periodTicks;
        ref var held = ref HeldTicks(signal);
        if (slot < _slot || ticks < held) { _late++; return; }
        held = ticks;
        if (slot > _slot)
        {
            if (_slot != long.MinValue && !_slotEmitted && _seen != 0) Emit();
            var gap = ticks - _lastUpdateTicks;
            // Stale may also have been raised on the plant clock while values were held up (a broker outage, a
            // gateway clock set back): the first newer value ends it, whatever its gap in event time. A lost source ends only by its own signals.
            if (_lastUpdateTicks != 0 && (gap > _staleTicks || IsStale) && _lost == 0) Resume(ticks);
            else if (_slot != long.MinValue && _slotEmitted) FillGap(slot);
            _slot = slot;
            _seen = 0;
            _slotEmitted = false;
        }
        if (ticks > _lastUpdateTicks) _lastUpdateTicks = ticks;
        if (_lost != 0 && (_lost &= (byte)~(1 << (int)signal)) == 0) Resume(ticks);
        Hold(signal, value, quality);
        _seen |= (byte)(1 << (int)signal);
        if (!_slotEmitted && (_seen & _required) == _required) Emit();
    }

    /// <summary>
    /// Moves the loop's clock to <paramref name="nowTicks"/> without data: closes an unfinished sampling interval and
    /// raises <c>stale</c> when nothing has arrived for the configured time.
    /// </summary>
    public void Advance(long nowTicks)
    {
        if (_slot != long.MinValue && !_slotEmitted && _seen != 0 && nowTicks >= (_slot + 2) * _periodTicks) Emit();
        if (_lastUpdateTicks != 0 && nowTicks - _lastUpdateTicks > _staleTicks && !IsStale)
        {
            Board.Set(new StaleFinding(new DateTimeOffset(_lastUpdateTicks, TimeSpan.Zero), null, Spec.Limits.StaleSeconds));
            foreach (var d in _detectors) d.Reset();
        }
    }

    /// <summary>
    /// The source of <paramref name="signal"/> reported itself offline at event time <paramref name="ticks"/> (a
    /// Sparkplug death certificate): the loop is stale at once, and stays so until that signal delivers again.
    /// </summary>
    public void SourceLost(Signal signal, long ticks, string source)
    {
        _lost |= (byte)(1 << (int)signal);
        if (IsStale) return;
        Board.Set(new SourceOfflineFinding(new DateTimeOffset(ticks, TimeSpan.Zero), null, source));
        foreach (var d in _detectors) d.Reset();
    }

    /// <summary>The loop's statistics over its analysis window.</summary>
    public LoopStatistics Statistics()
    {
        var stats = new LoopStatistics();
        foreach (var d in _detectors) stats = d.Fill(stats);
        return stats;
    }

    private void Resume(long ticks)
    {
        // Windows spanning a gap would mix two operating periods: restart them rather than fill hours of held values.
        foreach (var d in _detectors) d.Reset();
        Board.End(FindingKinds.Stale, new DateTimeOffset(ticks, TimeSpan.Zero));
    }

    private void FillGap(long nextSlot)
    {
        // Sample-and-hold across short gaps (a tag that skipped an interval) keeps the detectors' sample clock regular.
        for (var s = _slot + 1; s < nextSlot; s++) Step(s * _periodTicks);
    }

    private ref long HeldTicks(Signal signal)
    {
        switch (signal)
        {
            case Signal.Pv: return ref _pvTicks;
            case Signal.Sp: return ref _spTicks;
            case Signal.Op: return ref _opTicks;
            case Signal.Mode: return ref _modeTicks;
            default: return ref _positionTicks;
        }
    }

    private void Hold(Signal signal, double value, SampleQuality quality)
    {
        var good = quality != SampleQuality.Bad && double.IsFinite(value);
        if (!good) _bad++;
        switch (signal)
        {
            case Signal.Pv:
                _pvGood = good;
                if (good) _pv = value;
                break;
            case Signal.Sp: if (good) _sp = value; break;
            case Signal.Op: if (good) _op = value; break;
            case Signal.Position: if (good) _position = value; break;
            case Signal.Mode: if (good) _mode = value switch { 0 => LoopMode.Manual, 1 => LoopMode.Auto, 2 => LoopMode.Cascade, _ => LoopMode.Unknown }; break;
        }
    }

    private void Emit()
    {
        _slotEmitted = true;
        Step(_slot * _periodTicks);
    }

    private void Step(long ticks)
    {
        // While a source is offline its held value is not current: the detectors see nothing rather than a frozen tag.
        if (_lost != 0 || double.IsNaN(_pv) || double.IsNaN(_op)) return;
        var sample = new AlignedSample(ticks, _pv, _sp, _op, _position, _mode, _pvGood);
        _samples++;
        foreach (var d in _detectors) d.Step(sample, Board);
    }
}

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Quality;

/// <summary>
/// Pid loops: share of samples with the output at a limit, and time in auto, from a ring of one-minute buckets.
/// Raises <c>saturation</c> when the output sat at a limit in auto for most of the recent minutes, judged at each
/// minute boundary over the minutes completed. Bad-quality samples count nowhere.
/// </summary>
public sealed class SaturationDetector : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly QualityOptions _options;
    // One 32-byte tally per minute: a sample touches one cache line, not six arrays (thousands of loops do not fit in cache).
    private readonly MinuteTally[] _minutes;
    // The limits read on every sample, held here rather than behind the options object (one cache line fewer).
    private readonly double _highPct, _lowPct;
    private long _current = long.MinValue, _firstMinute = long.MinValue, _minuteEnd = long.MinValue;
    private int _slot;
    private bool _raised;
    private double _reported;

    /// <summary>A detector for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public SaturationDetector(LoopSpec spec, QualityOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new QualityOptions();
        var n = Math.Max(_options.StatisticsWindowMinutes, _options.SaturationWindowMinutes) + 1;
        _highPct = _options.SaturationHighPct;
        _lowPct = _options.SaturationLowPct;
        _minutes = new MinuteTally[n];
        for (var i = 0; i < n; i++) _minutes[i].Minute = long.MinValue;
    }

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (!sample.PvGood) return;
        if (sample.Ticks >= _minuteEnd)
        {
            // Divisions only at a minute boundary (event time only moves forward).
            var minute = sample.Ticks / TimeSpan.TicksPerMinute;
            _minuteEnd = (minute + 1) * TimeSpan.TicksPerMinute;
            if (_firstMinute == long.MinValue) _firstMinute = minute;
            _current = minute;
            Judge(sample.Ticks, board);
            _slot = Slot(minute);
        }
        ref var t = ref _minutes[_slot];
        var auto = sample.InAuto;
        t.Good++;
        if (auto) t.Auto++;
        if (sample.Op >= _highPct) { t.High++; if (auto) t.HighAuto++; }
        else if (sample.Op <= _lowPct) { t.Low++; if (auto) t.LowAuto++; }
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats)
    {
        if (_current == long.MinValue) return stats;
        // The statistics window includes the minute in progress.
        Sum(_current - _options.StatisticsWindowMinutes + 1, _current, out var good, out var auto, out var high, out var low, out _, out _);
        if (good == 0) return stats;
        return stats with
        {
            SaturatedPct = 100.0 * (high + low) / good,
            TimeInAutoPct = _spec.ModeTag is null ? null : 100.0 * auto / good,
        };
    }

    /// <inheritdoc />
    public override void Reset()
    {
        for (var i = 0; i < _minutes.Length; i++) _minutes[i].Minute = long.MinValue;
        _firstMinute = long.MinValue;
        _current = long.MinValue;
        _minuteEnd = long.MinValue;
    }

    private void Judge(long ticks, FindingBoard board)
    {
        var window = _options.SaturationWindowMinutes;
        // Judge only over whole minutes, and only once the window is full of them.
        if (_current - _firstMinute < window) return;
        Sum(_current - window, _current - 1, out var good, out _, out _, out _, out var highAuto, out var lowAuto);
        if (good == 0) return;
        var pct = 100.0 * (highAuto + lowAuto) / good;
        if (_raised && pct < _options.SaturationClearPct)
        {
            board.End(FindingKinds.Saturation, new DateTimeOffset(ticks, TimeSpan.Zero));
            _raised = false;
            return;
        }
        if (pct <= _options.SaturationRaisePct && !_raised) return;
        // Figures are updated only when the share has moved 5 points from the one reported.
        if (_raised && Math.Abs(pct - _reported) < 5) return;
        _reported = pct;
        board.Set(new SaturationFinding(new DateTimeOffset(ticks, TimeSpan.Zero), null, Math.Round(pct), highAuto >= lowAuto ? "high" : "low", window));
        _raised = true;
    }

    private void Sum(long from, long to, out long good, out long auto, out long high, out long low, out long highAuto, out long lowAuto)
    {
        good = auto = high = low = highAuto = lowAuto = 0;
        foreach (ref readonly var t in _minutes.AsSpan())
        {
            if (t.Minute < from || t.Minute > to) continue;
            good += t.Good; auto += t.Auto; high += t.High; low += t.Low; highAuto += t.HighAuto; lowAuto += t.LowAuto;
        }
    }

    private int Slot(long minute)
    {
        var slot = (int)(minute % _minutes.Length);
        if (_minutes[slot].Minute != minute) _minutes[slot] = new MinuteTally { Minute = minute };
        return slot;
    }

    private struct MinuteTally
    {
        public long Minute;
        public int Good, Auto, High, Low, HighAuto, LowAuto;
    }
}

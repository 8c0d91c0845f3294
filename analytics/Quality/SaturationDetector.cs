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
    private readonly long[] _minute;
    private readonly int[] _good, _auto, _high, _low, _highAuto, _lowAuto;
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
        _minute = new long[n];
        Array.Fill(_minute, long.MinValue);
        _good = new int[n];
        _auto = new int[n];
        _high = new int[n];
        _low = new int[n];
        _highAuto = new int[n];
        _lowAuto = new int[n];
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
        var slot = _slot;
        var auto = sample.InAuto;
        _good[slot]++;
        if (auto) _auto[slot]++;
        if (sample.Op >= _options.SaturationHighPct) { _high[slot]++; if (auto) _highAuto[slot]++; }
        else if (sample.Op <= _options.SaturationLowPct) { _low[slot]++; if (auto) _lowAuto[slot]++; }
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
        Array.Fill(_minute, long.MinValue);
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
        for (var i = 0; i < _minute.Length; i++)
        {
            var m = _minute[i];
            if (m < from || m > to) continue;
            good += _good[i]; auto += _auto[i]; high += _high[i]; low += _low[i]; highAuto += _highAuto[i]; lowAuto += _lowAuto[i];
        }
    }

    private int Slot(long minute)
    {
        var slot = (int)(minute % _minute.Length);
        if (_minute[slot] != minute)
        {
            _minute[slot] = minute;
            _good[slot] = _auto[slot] = _high[slot] = _low[slot] = _highAuto[slot] = _lowAuto[slot] = 0;
        }
        return slot;
    }
}

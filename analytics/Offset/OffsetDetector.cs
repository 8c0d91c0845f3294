using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Offset;

/// <summary>
/// Raises <c>sustained-offset</c> when the smoothed error SP - PV (% of span) stays beyond Limits:OffsetPct with one sign
/// for Limits:OffsetMinSeconds in auto, with the error steady, no oscillation on the board and no set-point move settling;
/// the cause is saturation when the output sat at a limit most of that time, else missing integral action.
/// </summary>
public sealed class OffsetDetector : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly OffsetOptions _options;
    private readonly double _alpha, _limit, _endLimit;
    private readonly long _minTicks, _settleTicks, _endTicks, _updateTicks;

    private double _filtered, _spReference = double.NaN;
    private bool _filterStarted;
    private long _settleUntil;
    private long _start, _count, _saturated;
    private int _sign;
    private double _sum, _sumSquares;
    private bool _active;
    private long _backSince, _lastUpdate;

    /// <summary>A detector for <paramref name="spec"/>.</summary>
    public OffsetDetector(LoopSpec spec, OffsetOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new OffsetOptions();
        var min = spec.Limits.OffsetMinSeconds;
        var tau = _options.FilterSeconds ?? min / 10;
        // The monitor fills gaps with held samples, so a fixed coefficient for the nominal interval is exact enough.
        _alpha = 1 - Math.Exp(-spec.Limits.SampleSeconds / Math.Max(tau, spec.Limits.SampleSeconds));
        _limit = spec.Limits.OffsetPct;
        _endLimit = _limit * (1 - _options.Hysteresis);
        _minTicks = Ticks(min);
        _settleTicks = Ticks(_options.SettleSeconds ?? min / 2);
        _endTicks = Ticks(_options.EndSeconds ?? min / 5);
        _updateTicks = Ticks(_options.UpdateEverySeconds);
    }

    /// <summary>The smoothed error SP - PV, % of span.</summary>
    public double SmoothedErrorPct => _filtered;

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (!sample.PvGood || double.IsNaN(sample.Sp)) return;
        var ticks = sample.Ticks;
        if (!sample.InAuto)
        {
            // In manual an offset is the operator's choice, not the controller's.
            if (_active) End(board, ticks);
            _count = 0;
            _filterStarted = false;
            _spReference = double.NaN;
            return;
        }
        var e = (sample.Sp - sample.Pv) / _spec.Span * 100;
        _filtered = _filterStarted ? _filtered + _alpha * (e - _filtered) : e;
        _filterStarted = true;
        TrackSetPoint(ticks, (sample.Sp - _spec.PvMin) / _spec.Span * 100);
        if (_active) Hold(sample, board, e);
        else Watch(sample, board, e);
    }

    /// <inheritdoc />
    public override void Reset()
    {
        _filterStarted = false;
        _spReference = double.NaN;
        if (!_active) _count = 0;
    }

    private void TrackSetPoint(long ticks, double spPct)
    {
        if (double.IsNaN(_spReference)) { _spReference = spPct; return; }
        if (Math.Abs(spPct - _spReference) <= _options.SpMovePct) return;
        // Ramps register as a series of moves, so the hold-off runs until the set point has stood still.
        _spReference = spPct;
        _settleUntil = ticks + _settleTicks;
    }

    private void Watch(in AlignedSample sample, FindingBoard board, double e)
    {
        var sign = Math.Sign(_filtered);
        if (sample.Ticks < _settleUntil || Math.Abs(_filtered) <= _limit)
        {
            _count = 0;
            return;
        }
        // An oscillating PV is not steady: the offset must then last its full time after the oscillation ends.
        if ((_count > 0 && sign != _sign) || board.IsActive(FindingKinds.Oscillation)) _count = 0;
        if (_count == 0)
        {
            _start = sample.Ticks;
            _sign = sign;
            _sum = _sumSquares = 0;
            _saturated = 0;
        }
        Accumulate(sample, e);
        if (sample.Ticks - _start < _minTicks) return;
        var mean = _sum / _count;
        var variance = Math.Max(0, _sumSquares / _count - mean * mean);
        if (Math.Sqrt(variance) > _options.SteadyRatio * Math.Abs(mean)) return;
        _active = true;
        _backSince = 0;
        Publish(board, sample.Ticks);
    }

    private void Hold(in AlignedSample sample, FindingBoard board, double e)
    {
        Accumulate(sample, e);
        if (Math.Abs(_filtered) < _endLimit)
        {
            if (_backSince == 0) _backSince = sample.Ticks;
            if (sample.Ticks - _backSince >= _endTicks) End(board, _backSince);
            return;
        }
        _backSince = 0;
        if (sample.Ticks - _lastUpdate >= _updateTicks) Publish(board, sample.Ticks);
    }

    private void Accumulate(in AlignedSample sample, double e)
    {
        _count++;
        _sum += e;
        _sumSquares += e * e;
        if (sample.Op >= _options.SaturatedHighPct || sample.Op <= _options.SaturatedLowPct) _saturated++;
    }

    private void Publish(FindingBoard board, long ticks)
    {
        _lastUpdate = ticks;
        var share = _count == 0 ? 0 : (double)_saturated / _count;
        var cause = share > _options.SaturatedShare ? OffsetCauses.OutputSaturated : OffsetCauses.NoIntegralAction;
        board.Set(new OffsetFinding(new DateTimeOffset(_start, TimeSpan.Zero), null, Math.Round(_filtered, 2),
            Math.Round((ticks - _start) / (double)TimeSpan.TicksPerSecond), Math.Round(100 * share, 1), cause));
    }

    private void End(FindingBoard board, long ticks)
    {
        board.End(FindingKinds.SustainedOffset, new DateTimeOffset(ticks, TimeSpan.Zero));
        _active = false;
        _count = 0;
    }

    private static long Ticks(double seconds) => (long)(seconds * TimeSpan.TicksPerSecond);
}

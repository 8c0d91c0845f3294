using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Agent.Storage;

/// <summary>
/// Accumulates one loop's aligned samples per clock hour of event time and hands an <see cref="HourlyStatsRow"/> to the
/// sink when the first sample of the next hour arrives. Window figures (error, reversals, starts, duty) are the
/// loop's rolling statistics at the end of the hour; seconds_* count sample periods with that finding on the board.
/// </summary>
public sealed class HourlyRecorder(LoopSpec spec, Func<LoopStatistics> statistics, Action<HourlyStatsRow> sink) : LoopDetector
{
    private const long HourTicks = TimeSpan.TicksPerHour;
    private readonly double _period = spec.Limits.SampleSeconds;
    private readonly long _staleTicks = (long)(spec.Limits.StaleSeconds * TimeSpan.TicksPerSecond);
    private long _hour = long.MinValue;
    private long _lastTicks;
    private long _samples, _spSamples, _opSamples;
    private double _pvSum, _pvMin, _pvMax, _spSum, _opSum, _opMin, _opMax;
    private double _osc, _offset, _cycling, _reversals, _any, _stale, _manual;

    /// <summary>Unix ms of the hour being accumulated, or null before the first sample.</summary>
    public long? HourMs => _hour == long.MinValue ? null : (_hour * HourTicks - DateTimeOffset.UnixEpoch.Ticks) / TimeSpan.TicksPerMillisecond;

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        var hour = sample.Ticks / HourTicks;
        if (hour != _hour)
        {
            if (_samples > 0) sink(Row());
            Clear(hour);
        }
        if (_lastTicks != 0 && sample.Ticks - _lastTicks > _staleTicks)
            _stale += Math.Min(sample.Ticks - _lastTicks, sample.Ticks - hour * HourTicks) / (double)TimeSpan.TicksPerSecond;
        _lastTicks = sample.Ticks;

        _samples++;
        _pvSum += sample.Pv;
        _pvMin = Math.Min(_pvMin, sample.Pv);
        _pvMax = Math.Max(_pvMax, sample.Pv);
        if (double.IsFinite(sample.Sp)) { _spSum += sample.Sp; _spSamples++; }
        if (double.IsFinite(sample.Op))
        {
            _opSum += sample.Op;
            _opMin = Math.Min(_opMin, sample.Op);
            _opMax = Math.Max(_opMax, sample.Op);
            _opSamples++;
        }
        if (sample.Mode == LoopMode.Manual) _manual += _period;
        var active = board.Active;
        if (active.Count == 0) return;
        _any += _period;
        for (var i = 0; i < active.Count; i++)
        {
            switch (active[i].Kind)
            {
                case FindingKinds.Oscillation: _osc += _period; break;
                case FindingKinds.SustainedOffset: _offset += _period; break;
                case FindingKinds.ShortCycling: _cycling += _period; break;
                case FindingKinds.ExcessiveReversals: _reversals += _period; break;
            }
        }
    }

    /// <summary>The row of the hour accumulated so far (also used to save a partial hour at shutdown).</summary>
    public HourlyStatsRow Row()
    {
        var s = statistics();
        return new HourlyStatsRow
        {
            LoopId = spec.Id,
            HourMs = HourMs ?? 0,
            Samples = _samples,
            PvMean = _samples > 0 ? _pvSum / _samples : null,
            PvMin = _samples > 0 ? _pvMin : null,
            PvMax = _samples > 0 ? _pvMax : null,
            SpMean = _spSamples > 0 ? _spSum / _spSamples : null,
            OpMean = _opSamples > 0 ? _opSum / _opSamples : null,
            OpMin = _opSamples > 0 ? _opMin : null,
            OpMax = _opSamples > 0 ? _opMax : null,
            MeanErrorPct = s.MeanErrorPct,
            ErrorStdPct = s.ErrorStdPct,
            Reversals = s.ReversalsPerHour is { } r ? (long)Math.Round(r) : null,
            TravelPct = s.TravelPctPerHour,
            SaturatedPct = s.SaturatedPct,
            TimeInAutoPct = s.TimeInAutoPct,
            Starts = s.StartsPerHour is { } st ? (long)Math.Round(st) : null,
            DutyPct = s.DutyPct,
            CyclePeriodS = s.CyclePeriodS,
            CycleAmplitudePct = s.CycleAmplitudePct,
            SecondsOscillating = _osc,
            SecondsOffset = _offset,
            SecondsShortCycling = _cycling,
            SecondsReversals = _reversals,
            SecondsAnyFinding = _any,
            SecondsStale = _stale,
            SecondsManual = _manual,
        };
    }

    private void Clear(long hour)
    {
        _hour = hour;
        _samples = _spSamples = _opSamples = 0;
        _pvSum = _spSum = _opSum = 0;
        _pvMin = _opMin = double.PositiveInfinity;
        _pvMax = _opMax = double.NegativeInfinity;
        _osc = _offset = _cycling = _reversals = _any = _stale = _manual = 0;
    }
}

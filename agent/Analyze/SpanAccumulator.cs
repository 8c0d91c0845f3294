using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Reversals;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Analytics.Statistics;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Sits last in a loop's detector list during offline analysis and adds up whole-span figures from every aligned
/// sample: error moments (<see cref="RunningMoments"/>), output reversals and travel with the loop's reversal deadband
/// (<see cref="ReversalCounter"/>, the live detector's filter), saturation, time in
/// auto, on-off starts, duty, cycle period and PV swing; and feeds the decimated trend. Allocates nothing per sample.
/// </summary>
public sealed class SpanAccumulator : LoopDetector
{
    // Output at or below 0.5 % or at or above 99.5 % counts as saturated (the saturation detector's defaults, common practice, no source).
    private const double SaturatedLow = 0.5, SaturatedHigh = 99.5;

    private readonly LoopSpec _spec;
    private readonly RunningMoments _error = new();
    private readonly ReversalCounter _output;
    private long _samples, _auto, _saturated, _on;
    private bool _stateKnown, _isOn;
    private long _starts, _firstStartTicks, _lastStartTicks;
    private double _pvMin = double.PositiveInfinity, _pvMax = double.NegativeInfinity, _swingSum;
    private long _swings;

    /// <summary>An accumulator for <paramref name="spec"/> with a trend of at most <paramref name="trendPoints"/> points.</summary>
    public SpanAccumulator(LoopSpec spec, int trendPoints = 600)
    {
        _spec = spec;
        _output = new ReversalCounter(spec.Limits.ReversalDeadbandPct);
        Trend = new TrendDecimator(trendPoints, TimeSpan.FromSeconds(spec.Limits.SampleSeconds));
    }

    /// <summary>The decimated trend of the whole span.</summary>
    public TrendDecimator Trend { get; }

    /// <summary>Event time of the first and last aligned sample (UTC ticks; 0 before any).</summary>
    public long FirstTicks { get; private set; }

    /// <inheritdoc cref="FirstTicks"/>
    public long LastTicks { get; private set; }

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (_samples++ == 0) FirstTicks = sample.Ticks;
        LastTicks = sample.Ticks;
        // On-off outputs come as 0/1 or 0/100; the trend's OP axis is %, so draw on as 100.
        Trend.Add(sample.Ticks, sample.Pv, sample.Sp, _spec.Kind == LoopKind.OnOff ? (sample.Op >= 0.5 ? 100 : 0) : sample.Op);
        if (sample.InAuto) _auto++;
        if (_spec.Kind == LoopKind.Pid) StepPid(sample);
        else StepOnOff(sample);
    }

    private void StepPid(in AlignedSample s)
    {
        if (s.Op <= SaturatedLow || s.Op >= SaturatedHigh) _saturated++;
        if (s.InAuto && s.PvGood && double.IsFinite(s.Sp)) _error.Add((s.Sp - s.Pv) / _spec.Span * 100.0);
        _output.Step(s.Ticks, s.Op);
    }

    private void StepOnOff(in AlignedSample s)
    {
        // On at 0.5 and above: outputs come as 0/1 or 0/100 (common practice, no source).
        var on = s.Op >= 0.5;
        if (on) _on++;
        if (!_stateKnown) { _stateKnown = true; _isOn = on; }
        else if (on != _isOn)
        {
            _isOn = on;
            if (on)
            {
                // A cycle runs from one start to the next; the first sample's state is not a start.
                if (_starts > 0 && _pvMax >= _pvMin) { _swingSum += _pvMax - _pvMin; _swings++; }
                if (_starts++ == 0) _firstStartTicks = s.Ticks;
                _lastStartTicks = s.Ticks;
                _pvMin = double.PositiveInfinity;
                _pvMax = double.NegativeInfinity;
            }
        }
        if (s.PvGood && _starts > 0)
        {
            var pct = _spec.ToPct(s.Pv);
            if (pct < _pvMin) _pvMin = pct;
            if (pct > _pvMax) _pvMax = pct;
        }
    }

    /// <summary>The whole-span figures so far.</summary>
    public SpanStatistics Figures()
    {
        var hours = _samples * _spec.Limits.SampleSeconds / 3600.0;
        var stats = new SpanStatistics { Hours = hours };
        if (_samples == 0) return stats;
        var pct = 100.0 / _samples;
        if (_spec.Kind == LoopKind.Pid)
        {
            var error = _error.Value;
            var moved = _output.Counters;
            return stats with
            {
                MeanErrorPct = error.Count > 0 ? error.Mean : null,
                ErrorStdPct = error.Count > 1 ? error.StdDev : null,
                Reversals = moved.Reversals,
                ReversalsPerHour = hours > 0 ? moved.Reversals / hours : null,
                TravelPct = moved.TravelPct,
                TravelPctPerHour = hours > 0 ? moved.TravelPct / hours : null,
                SaturatedPct = _saturated * pct,
                TimeInAutoPct = _auto * pct,
            };
        }
        return stats with
        {
            Starts = _starts,
            StartsPerHour = hours > 0 ? _starts / hours : null,
            CyclePeriodS = _starts > 1 ? (double)(_lastStartTicks - _firstStartTicks) / TimeSpan.TicksPerSecond / (_starts - 1) : null,
            DutyPct = _on * pct,
            CycleAmplitudePct = _swings > 0 ? _swingSum / _swings / 2 : null,
        };
    }
}

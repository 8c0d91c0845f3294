using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Quality;

/// <summary>Raises <c>out-of-range</c> when the PV stays more than a small tolerance outside its configured range, and ends it once back inside.</summary>
public sealed class OutOfRangeDetector : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly QualityOptions _options;
    private readonly double _low, _high;
    private int _outside, _inside;
    private double _worst;
    private bool _raised;

    /// <summary>A detector for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public OutOfRangeDetector(LoopSpec spec, QualityOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new QualityOptions();
        var margin = _options.OutOfRangeTolerancePct / 100.0 * spec.Span;
        _low = spec.PvMin - margin;
        _high = spec.PvMax + margin;
    }

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (!sample.PvGood) return;
        var pv = sample.Pv;
        if (pv < _low || pv > _high)
        {
            _inside = 0;
            if (_outside == 0 || Distance(pv) > Distance(_worst)) _worst = pv;
            if (++_outside < _options.OutOfRangeSamples || _raised) return;
            board.Set(new OutOfRangeFinding(new DateTimeOffset(sample.Ticks, TimeSpan.Zero), null, _worst, _spec.PvMin, _spec.PvMax, _spec.Unit));
            _raised = true;
            return;
        }
        _outside = 0;
        if (!_raised || ++_inside < _options.OutOfRangeSamples) return;
        board.End(FindingKinds.OutOfRange, new DateTimeOffset(sample.Ticks, TimeSpan.Zero));
        _raised = false;
        _inside = 0;
    }

    /// <inheritdoc />
    public override void Reset()
    {
        _outside = 0;
        _inside = 0;
    }

    private double Distance(double pv) => pv < _spec.PvMin ? _spec.PvMin - pv : pv - _spec.PvMax;
}

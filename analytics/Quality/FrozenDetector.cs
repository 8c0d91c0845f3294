using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Quality;

/// <summary>
/// Raises <c>frozen</c> when the PV has not moved beyond a tiny tolerance for a run of samples while the output moved
/// by more than a few %: a live process answers its final element, a stuck transmitter or a held value does not.
/// </summary>
public sealed class FrozenDetector : LoopDetector
{
    private readonly QualityOptions _options;
    private readonly double _tolerance;
    private bool _running, _raised;
    private double _ref, _opMin, _opMax;
    private long _run;

    /// <summary>A detector for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public FrozenDetector(LoopSpec spec, QualityOptions? options = null)
    {
        _options = options ?? new QualityOptions();
        _tolerance = _options.FrozenTolerancePct / 100.0 * spec.Span;
    }

    /// <summary>Samples the PV has stayed where it is.</summary>
    public long RunSamples => _run;

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (!sample.PvGood) return;
        if (!_running || Math.Abs(sample.Pv - _ref) > _tolerance)
        {
            if (_raised)
            {
                board.End(FindingKinds.Frozen, new DateTimeOffset(sample.Ticks, TimeSpan.Zero));
                _raised = false;
            }
            _running = true;
            _ref = sample.Pv;
            _opMin = _opMax = sample.Op;
            _run = 1;
            return;
        }
        _run++;
        if (sample.Op < _opMin) _opMin = sample.Op;
        if (sample.Op > _opMax) _opMax = sample.Op;
        if (_raised || _run < _options.FrozenSamples || _opMax - _opMin <= _options.FrozenOpMovePct) return;
        board.Set(new FrozenFinding(new DateTimeOffset(sample.Ticks, TimeSpan.Zero), null, _ref, _run, Math.Round(_opMax - _opMin, 1)));
        _raised = true;
    }

    /// <inheritdoc />
    public override void Reset()
    {
        // The run cannot be known to continue across a gap; an active finding ends with the next moving PV.
        if (!_raised) _running = false;
    }
}

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Analytics.Windows;
using static LoopWatch.Analytics.Advice.Rounding;

namespace LoopWatch.Analytics.Performance;

/// <summary>
/// Keeps a routine-operation window of the control error (% of span) and refits the Harris index every
/// <see cref="PerformanceOptions.EverySeconds"/> of event time; only when Tuning:DeadTimeSeconds is configured.
/// Allocates nothing per sample; the advice record is built only when statistics are read after a new fit.
/// </summary>
public sealed class PerformanceAdviser : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly PerformanceOptions _options;
    private readonly RingBuffer? _window;
    private readonly HarrisIndex? _harris;
    private readonly long _everyTicks;
    private readonly string? _reason;
    private readonly int _delay;
    private double _spReference = double.NaN;
    private long _nextFit = long.MinValue, _fitAt;
    private HarrisFigures? _figures;
    private bool _dirty = true;
    private PerformanceAdvice? _advice;

    /// <summary>An adviser for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public PerformanceAdviser(LoopSpec spec, PerformanceOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new PerformanceOptions();
        _everyTicks = (long)(_options.EverySeconds * TimeSpan.TicksPerSecond);
        var sample = spec.Limits.SampleSeconds;
        if (spec.Tuning.DeadTimeSeconds is not { } dead)
        {
            _reason = "Tuning:DeadTimeSeconds is not configured, and the minimum variance depends on the loop's dead time";
            return;
        }
        _delay = Math.Max(1, (int)Math.Round(dead / sample));
        var samples = (int)Math.Round(_options.WindowSeconds / sample);
        if (samples < 4 * _options.Order || _delay * 4 > samples)
        {
            _reason = $"a window of {samples} samples is too short for an AR({_options.Order}) fit with a dead time of {_delay} samples";
            return;
        }
        _window = new RingBuffer(samples);
        _harris = new HarrisIndex(samples, _options.Order, _delay);
    }

    /// <summary>The latest fit, or null before the first.</summary>
    public HarrisFigures? Figures => _figures;

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (_window is null) return;
        if (!sample.InAuto || double.IsNaN(sample.Sp))
        {
            _window.Clear();
            _spReference = double.NaN;
            return;
        }
        if (!sample.PvGood) return;
        var sp = (sample.Sp - _spec.PvMin) / _spec.Span * 100;
        if (double.IsNaN(_spReference) || Math.Abs(sp - _spReference) > _options.SpMovePct)
        {
            // A set-point move is not routine operation: the window starts again after it.
            if (!double.IsNaN(_spReference)) _window.Clear();
            _spReference = sp;
        }
        _window.Add((sample.Sp - sample.Pv) / _spec.Span * 100);
        if (_window.Count < _window.Capacity || sample.Ticks < _nextFit) return;
        _nextFit = sample.Ticks + _everyTicks;
        var input = _harris!.Input;
        var n = _window.Count;
        for (var i = 0; i < n; i++) input[i] = _window[n - 1 - i];
        _figures = _harris.Compute(n);
        _fitAt = sample.Ticks;
        _dirty = true;
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats)
    {
        if (_dirty || (_figures is null && _reason is null))
        {
            _advice = Work();
            _dirty = false;
        }
        return stats with { Advice = (stats.Advice ?? default) with { Performance = _advice } };
    }

    /// <inheritdoc />
    public override void Reset()
    {
        _window?.Clear();
        _spReference = double.NaN;
    }

    private PerformanceAdvice Work()
    {
        if (_reason is not null) return new PerformanceAdvice(null, _reason);
        var dead = _spec.Tuning.DeadTimeSeconds;
        if (_figures is not { } f)
        {
            var why = _fitAt == 0
                ? $"collecting a routine-operation window ({_window!.Count} of {_window.Capacity} samples in auto without set-point moves)"
                : "the last window had no variance or a singular fit";
            return new PerformanceAdvice(_fitAt == 0 ? null : At, why, dead, _spec.Limits.SampleSeconds, _delay, _options.Order, _window!.Capacity);
        }
        var impulse = new double[_delay];
        double sum = 0;
        for (var j = 0; j < _delay; j++)
        {
            impulse[j] = Significant(_harris!.Impulse[j]);
            sum += impulse[j] * impulse[j];
        }
        var sigmaY = Significant(Math.Sqrt(f.ErrorVariance));
        var sigmaA = Significant(Math.Sqrt(f.InnovationVariance));
        var sigmaMv = Significant(sigmaA * Math.Sqrt(sum));
        // A fit can put sigma_mv a little above sigma_y on a near-white error; the index is then 0, at minimum variance.
        var index = Significant(Math.Max(0, 1 - sigmaMv * sigmaMv / (sigmaY * sigmaY)));
        return new PerformanceAdvice(At, null, dead, _spec.Limits.SampleSeconds, _delay, f.Order, f.Samples, sigmaY, sigmaA, impulse, sigmaMv, index);
    }

    private DateTimeOffset At => new(_fitAt, TimeSpan.Zero);
}

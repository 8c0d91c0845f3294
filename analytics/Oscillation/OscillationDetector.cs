using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;
using LoopWatch.Analytics.Windows;

namespace LoopWatch.Analytics.Oscillation;

/// <summary>
/// Raises <c>oscillation</c> on a pid loop in auto when either Hagglund's load-disturbance count exceeds n_lim
/// (<see cref="LoadDisturbanceCounter"/>) or the error's ACF shows a regular oscillation (<see cref="AcfRegularity"/>)
/// with half peak-to-peak at least Limits:OscillationAmplitudePct; ends after some periods with neither. The cause hint
/// comes from Horch's OP-PV cross-correlation (<see cref="StictionCorrelation"/>).
/// </summary>
public sealed class OscillationDetector : LoopDetector
{
    // Enough samples a period for interpolated ACF crossings to place the period within a fraction of a percent.
    private const int WorkSamplesPerPeriod = 32;
    private const string AcfMethod = "acf-regularity", IaeMethod = "iae-count", BothMethods = "acf-regularity+iae-count";

    private readonly LoopSpec _spec;
    private readonly OscillationOptions _options;
    private readonly LoadDisturbanceCounter _counter;
    private readonly RingBuffer _error, _output;
    private readonly float[] _errorWork, _outputWork;
    private readonly double[] _crossings;
    private readonly double _windowSampleS, _defaultUltimateS;
    // Copied out of the spec and options, read on every sample: the detector's own cache lines, not three more objects'.
    private readonly double _span, _configuredUltimateS;

    private double _sumError, _sumOutput;
    private int _summed, _sinceEvaluation, _workStep = 1;
    private bool _wasAuto = true, _regular, _active;
    private double _observedPeriodS = double.NaN, _activePeriodS;
    private long _lastEvidenceTicks;

    /// <summary>A detector for <paramref name="spec"/>; all arrays are allocated here.</summary>
    public OscillationDetector(LoopSpec spec, OscillationOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new OscillationOptions();
        _defaultUltimateS = OscillationOptions.DefaultUltimatePeriodS(spec.Process);
        _span = spec.Span;
        _configuredUltimateS = _options.UltimatePeriodS ?? spec.Tuning.TiSeconds ?? double.NaN;
        _counter = new LoadDisturbanceCounter(spec.Limits.OscillationAmplitudePct, _options.SupervisionPeriods);
        var n = _options.WindowSamples;
        _error = new RingBuffer(n);
        _output = new RingBuffer(n);
        _errorWork = new float[n];
        _outputWork = new float[n];
        _crossings = new double[Math.Max(5, _options.ZeroCrossings)];
        var tu = _options.UltimatePeriodS ?? spec.Tuning.TiSeconds ?? _defaultUltimateS;
        Decimation = _options.Decimation
            ?? Math.Max(1, (int)Math.Ceiling(_options.WindowPeriods * tu / (n * spec.Limits.SampleSeconds)));
        _windowSampleS = Decimation * spec.Limits.SampleSeconds;
    }

    /// <summary>Raw samples averaged into one window sample.</summary>
    public int Decimation { get; }

    /// <summary>The T_u that sets Hagglund's IAE limit and T_sup now: option, Tuning:TiSeconds (Hagglund's suggestion), observed period, default by process kind.</summary>
    public double UltimatePeriodS =>
        !double.IsNaN(_configuredUltimateS) ? _configuredUltimateS : double.IsNaN(_observedPeriodS) ? _defaultUltimateS : _observedPeriodS;

    /// <summary>Hagglund's counter, for display and tests.</summary>
    public LoadDisturbanceCounter Counter => _counter;

    /// <summary>The last ACF evaluation (period in window samples).</summary>
    public AcfPeriod LastAcf { get; private set; } = AcfPeriod.None;

    /// <summary>The last Horch phase in degrees (0 even, 90 odd); NaN before any.</summary>
    public double LastPhaseDegrees { get; private set; } = double.NaN;

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (!sample.PvGood || double.IsNaN(sample.Sp) || double.IsNaN(sample.Op)) return;
        var ticks = sample.Ticks;
        if (!sample.InAuto)
        {
            // Only auto data describe the loop; an oscillation in manual is no longer the loop's.
            if (_wasAuto) RestartWindows();
            _wasAuto = false;
            if (_active) EndFinding(board, ticks);
            return;
        }
        _wasAuto = true;
        var e = (sample.Sp - sample.Pv) / _span * 100;
        // Measurement noise also crosses zero with some IAE: the count alone raises only once the ACF sees a regular period.
        if (_counter.Step(ticks, e, UltimatePeriodS) && _counter.LastWasLoad && _counter.Count > _options.LoadLimitCount
            && LastAcf.Regularity > _options.RegularityLimit)
        {
            _lastEvidenceTicks = ticks;
            if (!_active) Raise(board, ticks);
        }
        _sumError += e;
        _sumOutput += sample.Op;
        if (++_summed == Decimation)
        {
            // Block means are a cheap anti-alias filter for the decimated window.
            _error.Add(_sumError / Decimation);
            _output.Add(_sumOutput / Decimation);
            _sumError = _sumOutput = 0;
            _summed = 0;
            if (++_sinceEvaluation >= _options.EvaluateEverySamples && _error.Count >= _options.WindowSamples / 2)
            {
                _sinceEvaluation = 0;
                Evaluate(board, ticks);
            }
        }
        if (_active && ticks - _lastEvidenceTicks > EndAfterTicks()) EndFinding(board, ticks);
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats)
    {
        // Another detector with proper streaming moments may have filled these already; ours come from the (decimated) window.
        if (stats.MeanErrorPct is not null || _error.Count < 2) return stats;
        return stats with { MeanErrorPct = _error.Mean(), ErrorStdPct = _error.StandardDeviation() };
    }

    /// <inheritdoc />
    public override void Reset() => RestartWindows();

    private void Evaluate(FindingBoard board, long ticks)
    {
        var step = _workStep;
        var x = Shrink(_errorWork, _error.CopyTo(_errorWork), step);
        LagCorrelation.Center(x);
        var acf = AcfRegularity.Measure(x, x.Length / 2, _crossings);
        var periodSamples = acf.PeriodSamples * step;
        LastAcf = acf with { PeriodSamples = periodSamples };
        var regular = acf.Regularity > _options.RegularityLimit;
        _regular = regular && acf.Peak >= _options.MinAcfPeak
            && periodSamples * Decimation >= _options.MinPeriodSamples
            && _error.HalfRange(TwoPeriods(periodSamples * _windowSampleS)) >= _spec.Limits.OscillationAmplitudePct;
        // The ACF costs n^2: a long period is measured on block means, 32 to a period; anything else goes back to full rate.
        _workStep = regular ? Math.Clamp((int)(periodSamples / WorkSamplesPerPeriod), 1, Math.Max(1, _error.Capacity / 256)) : 1;
        if (_regular)
        {
            _observedPeriodS = periodSamples * _windowSampleS;
            _lastEvidenceTicks = ticks;
        }
        if (_active && board.IsActive(FindingKinds.Oscillation)) board.Set(Build(ticks, DateTimeOffset.MinValue));
        else if (_regular) Raise(board, ticks);
    }

    /// <summary>Block means of <paramref name="step"/> values, in place; returns the shortened window.</summary>
    private static Span<float> Shrink(float[] values, int count, int step)
    {
        if (step <= 1) return values.AsSpan(0, count);
        var m = count / step;
        var skip = count - m * step;
        for (var i = 0; i < m; i++)
        {
            float sum = 0;
            for (var j = 0; j < step; j++) sum += values[skip + i * step + j];
            values[i] = sum / step;
        }
        return values.AsSpan(0, m);
    }

    private void Raise(FindingBoard board, long ticks)
    {
        _active = true;
        board.Set(Build(ticks, new DateTimeOffset(ticks, TimeSpan.Zero)));
    }

    private OscillationFinding Build(long ticks, DateTimeOffset start)
    {
        var period = _regular ? LastAcf.PeriodSamples * _windowSampleS
            : !double.IsNaN(_counter.HalfPeriodS) ? 2 * _counter.HalfPeriodS : UltimatePeriodS;
        _activePeriodS = period;
        var amplitude = _error.HalfRange(TwoPeriods(period));
        var iae = _counter.CountAt(ticks) > _options.LoadLimitCount;
        var method = _regular && iae ? BothMethods : _regular ? AcfMethod : IaeMethod;
        double? regularity = double.IsNaN(LastAcf.Regularity) ? null : Math.Round(LastAcf.Regularity, 2);
        return new OscillationFinding(start, null, Math.Round(period, 1), Math.Round(double.IsNaN(amplitude) ? 0 : amplitude, 2),
            regularity, Cause(period / _windowSampleS), method);
    }

    private string Cause(double periodSamples)
    {
        // Horch (1999) states his test for processes without integration; a level loop's CCF is even either way.
        if (_spec.Process == ProcessKind.Level || _error.Count < 2) return CauseHints.Unknown;
        var step = _workStep;
        var pv = Shrink(_errorWork, _error.CopyTo(_errorWork), step);
        var op = Shrink(_outputWork, _output.CopyTo(_outputWork), step);
        var n = pv.Length;
        LagCorrelation.Center(pv);
        LagCorrelation.Center(op);
        // PV deviation is -e: exact while SP holds still, which is when an oscillation is judged.
        for (var i = 0; i < n; i++) pv[i] = -pv[i];
        var maxLag = (int)Math.Min(n / 2, Math.Ceiling(periodSamples / step));
        LastPhaseDegrees = StictionCorrelation.PhaseDegrees(op, pv, maxLag);
        return StictionCorrelation.Classify(LastPhaseDegrees, _options.OddPhaseDegrees, _options.EvenPhaseDegrees);
    }

    private int TwoPeriods(double periodS) => (int)Math.Ceiling(2 * periodS / _windowSampleS);

    private long EndAfterTicks()
    {
        var seconds = Math.Max(_options.EndAfterPeriods * _activePeriodS, 2 * _options.EvaluateEverySamples * _windowSampleS);
        return (long)(seconds * TimeSpan.TicksPerSecond);
    }

    private void EndFinding(FindingBoard board, long ticks)
    {
        board.End(FindingKinds.Oscillation, new DateTimeOffset(ticks, TimeSpan.Zero));
        _active = false;
        _regular = false;
        // A fresh count after the end is the hysteresis: n_lim new detections are needed to raise again.
        _counter.ClearCount();
    }

    private void RestartWindows()
    {
        _counter.Reset();
        _error.Clear();
        _output.Clear();
        _sumError = _sumOutput = 0;
        _summed = _sinceEvaluation = 0;
        _regular = false;
        _workStep = 1;
        LastAcf = AcfPeriod.None;
    }
}

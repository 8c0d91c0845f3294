using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;
using static LoopWatch.Analytics.Advice.Rounding;

namespace LoopWatch.Analytics.ProportionalBand;

/// <summary>
/// For pid loops without integral time: finds steady periods in blocks of event time, measures the process gain from
/// consecutive steady periods either side of a set-point change (or a manual output step), and works out the offset
/// other proportional bands would leave. A load change between two periods moves PV and OP against each other
/// (ratio -1/Kc, the controller's own line), so such pairs are not used. Works once per block, never per sample.
/// </summary>
public sealed class ProportionalBandAdviser : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly ProportionalBandOptions _options;
    private readonly long _blockTicks;
    private readonly double[] _gains, _scratch;
    private int _gainCount;

    private long _block = long.MinValue;
    private int _n;
    private bool _manual, _auto;
    private double _pv, _pv2, _sp, _op, _spMin, _spMax;

    private bool _hasPrevious;
    private double _prevPv, _prevSp, _prevOp;
    private bool _prevManual;
    private SteadyLevel? _level, _lastLevel;

    private (SteadyLevel From, SteadyLevel To)? _pair;
    private bool _offsetActive, _dirty = true;
    private long _at;
    private ProportionalBandAdvice? _advice;

    /// <summary>An adviser for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public ProportionalBandAdviser(LoopSpec spec, ProportionalBandOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new ProportionalBandOptions();
        _blockTicks = Math.Max(1, (long)(_options.BlockSeconds * TimeSpan.TicksPerSecond));
        _gains = new double[Math.Max(1, _options.Pairs)];
        _scratch = new double[_gains.Length];
    }

    /// <summary>The measured process gain (median of the recent pairs), or null before the first pair.</summary>
    public double? ProcessGain => _gainCount == 0 ? null : Median();

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        var block = sample.Ticks / _blockTicks;
        if (block != _block)
        {
            if (_block != long.MinValue) CloseBlock(block == _block + 1);
            // Read once a block: the offset finding decides whether a loop without known tuning is worth a word.
            _offsetActive = board.Get(FindingKinds.SustainedOffset) is Offset.OffsetFinding { Cause: Offset.OffsetCauses.NoIntegralAction };
            _block = block;
            _n = 0;
            _manual = _auto = false;
            _pv = _pv2 = _sp = _op = 0;
            _spMin = double.PositiveInfinity;
            _spMax = double.NegativeInfinity;
        }
        // Bad values are held out of the block (as out of every statistic); a block left with too few is not judged.
        if (!sample.PvGood || double.IsNaN(sample.Sp) || double.IsNaN(sample.Op)) return;
        var pv = _spec.ToPct(sample.Pv);
        _n++;
        _pv += pv;
        _pv2 += pv * pv;
        var sp = _spec.ToPct(sample.Sp);
        _sp += sp;
        if (sp < _spMin) _spMin = sp;
        if (sp > _spMax) _spMax = sp;
        _op += sample.Op;
        if (sample.InAuto) _auto = true;
        else _manual = true;
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats)
    {
        if (_dirty)
        {
            _advice = Work();
            _dirty = false;
        }
        return _advice is null ? stats : stats with { Advice = (stats.Advice ?? default) with { OffsetWhatIf = _advice } };
    }

    /// <inheritdoc />
    public override void Reset()
    {
        _block = long.MinValue;
        Break();
    }

    private void CloseBlock(bool next)
    {
        var expected = _options.BlockSeconds / _spec.Limits.SampleSeconds;
        if (!next || (_manual && _auto) || _n < expected / 2) { Break(); return; }
        double pv = _pv / _n, sp = _sp / _n, op = _op / _n;
        var std = Math.Sqrt(Math.Max(0, _pv2 / _n - pv * pv));
        var start = _block * _blockTicks;
        var end = start + _blockTicks;
        // A block with a set-point move in it holds the move's transient: never steady.
        if (std > _options.SteadyStdPct || _spMax - _spMin > _options.MinSpStepPct / 2) { Break(); return; }
        var agrees = _hasPrevious && _prevManual == _manual && Math.Abs(pv - _prevPv) <= _options.PvDriftPct
            && Math.Abs(op - _prevOp) <= _options.OpDriftPct && Math.Abs(sp - _prevSp) <= _options.MinSpStepPct / 2;
        if (!agrees)
        {
            Break();
        }
        else if (_level is { } level)
        {
            _level = level.Extend(pv, sp, op, end);
        }
        else
        {
            // The first of the two agreeing blocks may still hold the tail of a transient: the level starts with the second.
            _level = new SteadyLevel(1, pv, sp, op, _manual, start, end);
            if (_lastLevel is { } last) Pair(last, _level.Value);
        }
        _hasPrevious = true;
        (_prevPv, _prevSp, _prevOp, _prevManual) = (pv, sp, op, _manual);
        _at = end;
        _dirty = true;
    }

    private void Break()
    {
        if (_level is { } level) _lastLevel = level;
        _level = null;
        _hasPrevious = false;
        _dirty = true;
    }

    private void Pair(SteadyLevel from, SteadyLevel to)
    {
        if (from.Manual != to.Manual) return;
        var dOp = to.OpPct - from.OpPct;
        if (Math.Abs(dOp) < _options.MinOpStepPct) return;
        if (!to.Manual && Math.Abs(to.SpPct - from.SpPct) < _options.MinSpStepPct) return;
        var gain = (to.PvPct - from.PvPct) / dOp;
        if (gain == 0 || !double.IsFinite(gain)) return;
        _gains[_gainCount % _gains.Length] = Math.Abs(gain);
        _gainCount++;
        _pair = (from, to);
    }

    private double Median() => Statistics.Median.Of(_gains.AsSpan(0, Math.Min(_gainCount, _gains.Length)), _scratch);

    private ProportionalBandAdvice? Work()
    {
        var tuning = _spec.Tuning;
        DateTimeOffset? at = _at == 0 ? null : new DateTimeOffset(_at, TimeSpan.Zero);
        if (tuning.Kc is not { } kcKnown)
            return _offsetActive ? new ProportionalBandAdvice(at, "Tuning:Kc or Tuning:PbPct is not configured, so the offset of another band cannot be worked out") : null;
        if (_pair is not { } pair)
            return new ProportionalBandAdvice(at, "waiting for steady periods either side of a set-point change (or of a manual output step) to measure the process gain; " +
                "a load change alone moves PV and output by the controller's own ratio and says nothing about the process");
        var current = _level ?? _lastLevel;
        if (current is not { } now || now.Manual) return new ProportionalBandAdvice(at, "waiting for a steady period in auto");
        var kc = Significant(kcKnown);
        var pb = Significant(100 / kc);
        // The median is taken of the gains as printed, so the page's figures give it by hand.
        var pairs = Math.Min(_gainCount, _gains.Length);
        var gains = new double[pairs];
        for (var i = 0; i < pairs; i++) gains[i] = Significant(_gains[(_gainCount - pairs + i) % _gains.Length]);
        var kp = Significant(Statistics.Median.Of(gains, _scratch));
        var offset = Significant(now.ErrorPct);
        var load = Significant(offset * (1 + kc * kp));
        double? ku = null, w = null;
        if (tuning.DeadTimeSeconds is { } dead && tuning.TimeConstantSeconds is { } tau)
        {
            var (u, omega) = UltimateGain.Of(kp, tau, dead);
            (ku, w) = (Significant(u), Significant(omega));
        }
        var rows = new BandRow[_options.BandFactors.Count];
        for (var i = 0; i < rows.Length; i++)
        {
            var f = _options.BandFactors[i];
            var rowPb = Significant(pb * f);
            var rowKc = Significant(100 / rowPb);
            rows[i] = new BandRow(rowPb, rowKc, Significant(load / (1 + rowKc * kp)), ku is { } k ? Significant(k / rowKc) : null, f == 1);
        }
        var (from, to) = pair;
        return new ProportionalBandAdvice(at, null, pb, kc, kp, Math.Min(_gainCount, _gains.Length),
            Significant(to.SpPct - from.SpPct), Significant(to.PvPct - from.PvPct), Significant(to.OpPct - from.OpPct), to.Manual,
            offset, load, tuning.DeadTimeSeconds, tuning.TimeConstantSeconds, w, w is { } ww ? Significant(2 * Math.PI / ww) : null,
            ku, ku is { } kk ? Significant(100 / kk) : null, rows, gains);
    }
}

using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.OnOff;
using LoopWatch.Analytics.Sampling;
using static LoopWatch.Analytics.Advice.Rounding;

namespace LoopWatch.Analytics.DeadZone;

/// <summary>
/// Sizes the dead zone of an on-off loop from its own cycles: the least-squares slope of the PV over each off and on
/// period, the PV at the switching edges, medians over the recent periods. Reworked once per cycle (at a start), never
/// per sample; the advice record is built only when statistics are read.
/// </summary>
public sealed class DeadZoneAdviser : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly ShortCyclingDetector _cycles;
    private readonly DeadZoneOptions _options;
    private readonly double _halfSampleS;
    private readonly double[] _offRates, _onRates, _onEdges, _offEdges, _scratch;
    private int _offN, _onN, _onEdgeN, _offEdgeN;
    private bool _known, _on;
    private long _halfStart = long.MinValue, _at;
    private SlopeSums _half;
    private bool _dirty = true;
    private DeadZoneAdvice? _advice;

    /// <summary>An adviser for <paramref name="spec"/> reading edges the way <paramref name="cycles"/> does.</summary>
    public DeadZoneAdviser(LoopSpec spec, ShortCyclingDetector cycles, DeadZoneOptions? options = null)
    {
        _spec = spec;
        _cycles = cycles;
        _options = options ?? new DeadZoneOptions();
        _halfSampleS = spec.Limits.SampleSeconds / 2;
        var n = Math.Max(1, _options.RecentHalves);
        _offRates = new double[n];
        _onRates = new double[n];
        _onEdges = new double[n];
        _offEdges = new double[n];
        _scratch = new double[n];
    }

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        var on = _cycles.IsOn(sample.Op);
        if (!_known)
        {
            _known = true;
            _on = on;
        }
        else if (on != _on)
        {
            // Only a period that began at an edge is whole; its slope is the PV rate in that state (unit per minute).
            var slope = _halfStart == long.MinValue ? double.NaN : _half.Slope * 60;
            if (double.IsFinite(slope))
            {
                if (_on) Push(_onRates, ref _onN, slope);
                else Push(_offRates, ref _offN, slope);
                // The switching point is where the ending period's line stands between the last sample before the edge and
                // the edge sample (the turn fell somewhere in that interval); the edge sample itself is already past it, and noisy.
                var edge = _half.ValueAt((sample.Ticks - _halfStart) / (double)TimeSpan.TicksPerSecond - _halfSampleS);
                if (on) Push(_onEdges, ref _onEdgeN, edge);
                else Push(_offEdges, ref _offEdgeN, edge);
            }
            _on = on;
            _halfStart = sample.Ticks;
            _half = default;
            if (on)
            {
                _at = sample.Ticks;
                _dirty = true;
            }
        }
        if (_halfStart != long.MinValue && sample.PvGood)
            _half.Add((sample.Ticks - _halfStart) / (double)TimeSpan.TicksPerSecond, sample.Pv);
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats)
    {
        if (_dirty)
        {
            _advice = Work();
            _dirty = false;
        }
        return stats with { Advice = (stats.Advice ?? default) with { DeadZone = _advice } };
    }

    /// <inheritdoc />
    public override void Reset()
    {
        _known = false;
        _halfStart = long.MinValue;
        _half = default;
    }

    private DeadZoneAdvice Work()
    {
        var max = _spec.Limits.MaxStartsPerHour;
        DateTimeOffset? at = _at == 0 ? null : new DateTimeOffset(_at, TimeSpan.Zero);
        var need = _options.MinHalves;
        if (Math.Min(Math.Min(_offN, _onN), Math.Min(_onEdgeN, _offEdgeN)) < need)
            return new DeadZoneAdvice(at, $"waiting for {need} measured on and off periods", _spec.Unit, max);
        var rOff = Significant(Median(_offRates, _offN));
        var rOn = Significant(Median(_onRates, _onN));
        if (Math.Sign(rOff) == Math.Sign(rOn) || rOff == 0 || rOn == 0)
            return new DeadZoneAdvice(at, "the PV does not turn round between on and off periods, so the switching does not set its swing", _spec.Unit, max);
        var start = Significant(Median(_onEdges, _onEdgeN));
        var stop = Significant(Median(_offEdges, _offEdgeN));
        double aOff = Math.Abs(rOff), aOn = Math.Abs(rOn);
        var d = Significant(Math.Abs(start - stop));
        // Integrating PV: the time to cross the dead zone is band / rate each way.
        var cycle = Significant(d / aOff + d / aOn);
        var sph = Significant(60 / cycle);
        var target = Significant(60 / max);
        var narrowest = Significant(target / (1 / aOff + 1 / aOn));
        // Wet-well rule: with a level, rate off + rate on = pump rate / area, and the shortest cycle 4D/(sum) comes at half the pump rate.
        double? worst = _spec.Process == ProcessKind.Level ? Significant(target * (aOff + aOn) / 4) : null;
        var measured = _cycles.Figures.StartsPerHour is { } m ? Significant(m) : (double?)null;
        return new DeadZoneAdvice(at, null, _spec.Unit, max, Math.Min(Math.Min(_offN, _onN), _options.RecentHalves), rOff, rOn, start, stop, d, cycle, sph,
            measured, target, narrowest, Significant(narrowest / _spec.Span * 100), worst);
    }

    private static void Push(double[] ring, ref int count, double value)
    {
        ring[count % ring.Length] = value;
        count++;
    }

    private double Median(double[] ring, int count) => Statistics.Median.Of(ring.AsSpan(0, Math.Min(count, ring.Length)), _scratch);
}

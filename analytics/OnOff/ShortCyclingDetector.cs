using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.OnOff;

/// <summary>
/// On-off loops: cycle period, starts per hour, duty and PV cycle amplitude from the output edges and the PV;
/// raises <c>short-cycling</c> above <see cref="LoopLimits.MaxStartsPerHour"/>. Figures are reworked once per
/// complete cycle and once a minute (so a loop that stops cycling ends its finding), never per sample; an active
/// finding gets new figures only when starts per hour moved more than 5 % from those reported.
/// </summary>
public sealed class ShortCyclingDetector : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly OnOffOptions _options;
    private readonly CycleTracker _tracker;
    private long _lastTicks, _nextMinuteTicks = long.MinValue;
    private readonly double _pctScale;
    private bool _raised;
    private double _reported;

    /// <summary>A detector for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public ShortCyclingDetector(LoopSpec spec, OnOffOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new OnOffOptions();
        _pctScale = 100.0 / spec.Span;
        _tracker = new CycleTracker(Math.Max(_options.HistoryCycles, 2 * _options.RecentCycles));
    }

    /// <summary>The cycles seen so far.</summary>
    public CycleTracker Tracker => _tracker;

    /// <summary>The current cycle figures, including the trends that <see cref="LoopStatistics"/> has no room for.</summary>
    public CycleFigures Figures => _tracker.Figures(_lastTicks, _options.RecentCycles);

    /// <summary>True when <paramref name="op"/> means on: a 0/1 flag reads 1 as on, otherwise at or above the threshold (%).</summary>
    public bool IsOn(double op) => op >= _options.OnThresholdPct || (op >= 0.5 && op <= 1.0);

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        _lastTicks = sample.Ticks;
        var completed = _tracker.Step(sample.Ticks, IsOn(sample.Op), (sample.Pv - _spec.PvMin) * _pctScale, sample.PvGood);
        if (!completed && sample.Ticks < _nextMinuteTicks) return;
        _nextMinuteTicks = (sample.Ticks / TimeSpan.TicksPerMinute + 1) * TimeSpan.TicksPerMinute;
        Judge(sample.Ticks, completed, board);
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats)
    {
        var f = Figures;
        return stats with { CyclePeriodS = f.PeriodS, StartsPerHour = f.StartsPerHour, DutyPct = f.DutyPct, CycleAmplitudePct = f.AmplitudePct };
    }

    /// <inheritdoc />
    public override void Reset() => _tracker.Reset();

    private void Judge(long ticks, bool completed, FindingBoard board)
    {
        var f = _tracker.Figures(ticks, _options.RecentCycles);
        if (f.StartsPerHour is not { } sph) return;
        var max = _spec.Limits.MaxStartsPerHour;
        if (_raised && sph < max * _options.ClearFraction)
        {
            board.End(FindingKinds.ShortCycling, new DateTimeOffset(ticks, TimeSpan.Zero));
            _raised = false;
            return;
        }
        // Raise on any evaluation; update only on a complete cycle that moved the rate by more than 5 %, so records stay rare.
        if (sph <= max || f.Cycles < _options.MinCycles) return;
        if (_raised && (!completed || Math.Abs(sph - _reported) <= 0.05 * _reported)) return;
        _reported = sph;
        board.Set(new ShortCyclingFinding(new DateTimeOffset(ticks, TimeSpan.Zero), null,
            Math.Round(sph, 1), Math.Round(f.PeriodS ?? 0, 1), Math.Round(f.DutyPct ?? 0, 1),
            Math.Round(f.AmplitudePct ?? 0, 2), max));
        _raised = true;
    }
}

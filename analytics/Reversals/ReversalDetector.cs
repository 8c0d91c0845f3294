using LoopWatch.Analytics.Configuration;
using LoopWatch.Analytics.Findings;
using LoopWatch.Analytics.Monitoring;
using LoopWatch.Analytics.Sampling;

namespace LoopWatch.Analytics.Reversals;

/// <summary>
/// Pid loops: reversals and travel of the output, and of the valve position when the loop has a position tag; raises
/// <c>excessive-reversals</c> when the output reverses more than <see cref="LoopLimits.MaxReversalsPerHour"/>, judged once a
/// minute. Samples with bad PV quality are skipped like everywhere else; a move across them still counts as travel.
/// </summary>
public sealed class ReversalDetector : LoopDetector
{
    private readonly LoopSpec _spec;
    private readonly ReversalOptions _options;
    private long _nextMinuteTicks = long.MinValue;
    private bool _raised;
    private double _reported;

    /// <summary>A detector for <paramref name="spec"/> with <paramref name="options"/> or the defaults.</summary>
    public ReversalDetector(LoopSpec spec, ReversalOptions? options = null)
    {
        _spec = spec;
        _options = options ?? new ReversalOptions();
        Output = new ReversalCounter(spec.Limits.ReversalDeadbandPct, _options.WindowMinutes, _options.ResidueCapacity);
        if (spec.PositionTag is not null)
            Position = new ReversalCounter(spec.Limits.ReversalDeadbandPct, _options.WindowMinutes, _options.ResidueCapacity);
    }

    /// <summary>The controller output's counter (counters, rates, rainflow histogram).</summary>
    public ReversalCounter Output { get; }

    /// <summary>The valve position's counter, or null when the loop has no position tag.</summary>
    public ReversalCounter? Position { get; }

    /// <summary>Restores lifetime counters saved by storage; call before the first sample.</summary>
    public void Seed(in ElementCounters output, in ElementCounters? position = null)
    {
        Output.Seed(output);
        if (position is { } p) Position?.Seed(p);
    }

    /// <inheritdoc />
    public override void Step(in AlignedSample sample, FindingBoard board)
    {
        if (!sample.PvGood) return;
        Output.Step(sample.Ticks, sample.Op);
        Position?.Step(sample.Ticks, sample.Position);
        if (sample.Ticks < _nextMinuteTicks) return;
        _nextMinuteTicks = (sample.Ticks / TimeSpan.TicksPerMinute + 1) * TimeSpan.TicksPerMinute;
        Judge(sample.Ticks, board);
    }

    /// <inheritdoc />
    public override LoopStatistics Fill(LoopStatistics stats) =>
        stats with { ReversalsPerHour = Output.ReversalsPerHour, TravelPctPerHour = Output.TravelPctPerHour };

    /// <inheritdoc />
    public override void Reset()
    {
        Output.RestartWindow();
        Position?.RestartWindow();
    }

    private void Judge(long ticks, FindingBoard board)
    {
        if (Output.ReversalsPerHour is not { } rate || Output.WindowSeconds < _options.MinWindowMinutes * 60.0) return;
        var max = _spec.Limits.MaxReversalsPerHour;
        if (_raised && rate < max * _options.ClearFraction)
        {
            board.End(FindingKinds.ExcessiveReversals, new DateTimeOffset(ticks, TimeSpan.Zero));
            _raised = false;
            return;
        }
        if (rate <= max) return;
        // Figures are updated only when the rate has moved more than 5 % from the one reported.
        if (_raised && Math.Abs(rate - _reported) <= 0.05 * _reported) return;
        _reported = rate;
        board.Set(new ExcessiveReversalsFinding(new DateTimeOffset(ticks, TimeSpan.Zero), null,
            Math.Round(rate), Math.Round(Output.TravelPctPerHour ?? 0), max,
            Position?.ReversalsPerHour is { } pr ? Math.Round(pr) : null,
            Position?.TravelPctPerHour is { } pt ? Math.Round(pt) : null));
        _raised = true;
    }
}

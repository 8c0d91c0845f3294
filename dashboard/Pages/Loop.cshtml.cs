using LoopWatch.Dashboard.Charts;
using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>One loop: its trend over the last hour, findings and statistics.</summary>
public sealed class LoopModel(IPlantView plant, Storage.Reading.StorageReader? reader = null, IAlarmView? alarms = null,
    Reports.ShiftSchedule? shifts = null) : PageModel
{
    /// <summary>The spans a trend can cover; beyond the hour the points are hourly means from storage.</summary>
    public static readonly IReadOnlyList<(string Key, string Label)> Spans = [("hour", "last hour"), ("shift", "shift"), ("day", "day"), ("week", "week")];

    public string Span { get; private set; } = "hour";
    public int Markers { get; private set; }
    public LoopView? View { get; private set; }
    public DateTimeOffset Now { get; private set; }
    public string TrendSvg { get; private set; } = "";
    public IReadOnlyList<(string Name, double? Value)> Statistics { get; private set; } = [];

    public async Task<IActionResult> OnGetAsync([FromQuery] string? id, [FromQuery] string? span, CancellationToken ct)
    {
        View = id is null ? null : plant.Loop(id);
        if (View is null) return NotFound();
        Now = plant.Now;
        Span = Spans.Any(s => s.Key == span) ? span! : "hour";
        var length = Span switch
        {
            "shift" => TimeSpan.FromHours(shifts?.LengthHours ?? 8),
            "day" => TimeSpan.FromDays(1),
            "week" => TimeSpan.FromDays(7),
            _ => TimeSpan.FromHours(1),
        };
        var from = Now - length;
        IReadOnlyList<TrendPoint> points = Span == "hour" || reader is null ? plant.Trend(id!, length) : await HourlyAsync(id!, from, ct);
        var markers = View.Findings.Select(f => new TrendMarker(f.Start, $"{f.Kind} raised")).ToList();
        // Alarm transitions still held in memory, so the trend shows when alarms came and went.
        if (alarms is not null)
            markers.AddRange(alarms.Transitions(from).Where(t => t.LoopId == id).Select(t => new TrendMarker(t.Time, $"{t.Kind}: {t.From} to {t.To}")));
        Markers = markers.Count;
        TrendSvg = SvgTrend.Render(points, View.PvMin, View.PvMax, View.Unit, from, Now, markers, $"{View.Id} trend, {Spans.First(s => s.Key == Span).Label}");
        var s = View.Statistics;
        Statistics = View.Kind == "pid"
            ? [("mean_error_pct", s.MeanErrorPct), ("error_std_pct", s.ErrorStdPct), ("reversals_per_hour", s.ReversalsPerHour),
               ("travel_pct_per_hour", s.TravelPctPerHour), ("saturated_pct", s.SaturatedPct), ("time_in_auto_pct", s.TimeInAutoPct)]
            : [("cycle_period_s", s.CyclePeriodS), ("starts_per_hour", s.StartsPerHour), ("duty_pct", s.DutyPct), ("cycle_amplitude_pct", s.CycleAmplitudePct)];
        return Page();
    }

    private async Task<IReadOnlyList<TrendPoint>> HourlyAsync(string id, DateTimeOffset from, CancellationToken ct)
    {
        var rows = await reader!.ReadHourlyStatsAsync(id, from.ToUnixTimeMilliseconds(), Now.ToUnixTimeMilliseconds() + 1, ct);
        // An hourly mean is drawn at the middle of its hour.
        return rows.Where(r => r.PvMean is not null)
            .Select(r => new TrendPoint(DateTimeOffset.FromUnixTimeMilliseconds(r.HourMs).UtcTicks + TimeSpan.TicksPerMinute * 30,
                (float)r.PvMean!.Value, (float)(r.SpMean ?? double.NaN), (float)(r.OpMean ?? double.NaN)))
            .OrderBy(p => p.Ticks).ToList();
    }
}

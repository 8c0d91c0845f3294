using LoopWatch.Dashboard.Charts;
using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>One loop: its trend over the last hour, findings and statistics.</summary>
public sealed class LoopModel(IPlantView plant) : PageModel
{
    public LoopView? View { get; private set; }
    public DateTimeOffset Now { get; private set; }
    public string TrendSvg { get; private set; } = "";
    public IReadOnlyList<(string Name, double? Value)> Statistics { get; private set; } = [];

    public IActionResult OnGet([FromQuery] string? id)
    {
        View = id is null ? null : plant.Loop(id);
        if (View is null) return NotFound();
        Now = plant.Now;
        var span = TimeSpan.FromHours(1);
        var points = plant.Trend(id!, span);
        var markers = View.Findings.Select(f => new TrendMarker(f.Start, $"{f.Kind} raised")).ToList();
        TrendSvg = SvgTrend.Render(points, View.PvMin, View.PvMax, View.Unit, Now - span, Now, markers, $"{View.Id} trend, last hour");
        var s = View.Statistics;
        Statistics = View.Kind == "pid"
            ? [("mean_error_pct", s.MeanErrorPct), ("error_std_pct", s.ErrorStdPct), ("reversals_per_hour", s.ReversalsPerHour),
               ("travel_pct_per_hour", s.TravelPctPerHour), ("saturated_pct", s.SaturatedPct), ("time_in_auto_pct", s.TimeInAutoPct)]
            : [("cycle_period_s", s.CyclePeriodS), ("starts_per_hour", s.StartsPerHour), ("duty_pct", s.DutyPct), ("cycle_amplitude_pct", s.CycleAmplitudePct)];
        return Page();
    }
}

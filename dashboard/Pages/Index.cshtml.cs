using LoopWatch.Analytics.Findings;
using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>The plant overview: every loop with its values, findings and active alarms, worst first, filterable by area and finding kind.</summary>
public sealed class IndexModel(IPlantView plant, IAlarmView? alarms = null) : PageModel
{
    public IReadOnlyList<LoopView> Loops { get; private set; } = [];
    public IReadOnlyList<string> Areas { get; private set; } = [];
    public ILookup<string, AlarmView> AlarmsByLoop { get; private set; } = Array.Empty<AlarmView>().ToLookup(a => a.LoopId);
    public DateTimeOffset Now { get; private set; }
    public int Total { get; private set; }
    public int Healthy { get; private set; }
    public int WithFindings { get; private set; }
    public int InManual { get; private set; }
    public int Stale { get; private set; }

    [BindProperty(SupportsGet = true)] public string? Area { get; set; }
    [BindProperty(SupportsGet = true)] public string? Finding { get; set; }

    public void OnGet()
    {
        Now = plant.Now;
        var all = plant.Loops();
        AlarmsByLoop = (alarms?.Alarms(activeOnly: true) ?? []).ToLookup(a => a.LoopId);
        Areas = all.Select(l => l.Area).Where(a => a.Length > 0).Distinct().Order(StringComparer.Ordinal).ToList();
        var counts = LoopCounts.Of(all);
        (Total, Healthy, WithFindings, InManual, Stale) = (counts.Total, counts.Healthy, counts.WithFindings, counts.InManual, counts.Stale);
        Loops = all
            .Where(l => string.IsNullOrEmpty(Area) || l.Area == Area)
            .Where(l => string.IsNullOrEmpty(Finding) || l.Findings.Any(f => f.Kind == Finding))
            .Select((l, i) => (l, i))
            .OrderBy(x => Rank(x.l))
            .ThenByDescending(x => AlarmsByLoop[x.l.Id].Count())
            .ThenByDescending(x => x.l.Findings.Count)
            .ThenBy(x => x.i)
            .Select(x => x.l)
            .ToList();
    }

    /// <summary>Worst first: stale, then loops with alarms or findings, then manual, then healthy.</summary>
    private int Rank(LoopView l) => IsStale(l) ? 0 : AlarmsByLoop[l.Id].Any() ? 1 : l.Findings.Count > 0 ? 2 : l.Mode == "manual" ? 3 : 4;

    private static bool IsStale(LoopView l) => LoopCounts.IsStale(l);
}

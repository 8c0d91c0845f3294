using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>The plant overview: every loop with its values and findings, worst first.</summary>
public sealed class IndexModel(IPlantView plant) : PageModel
{
    public IReadOnlyList<LoopView> Loops { get; private set; } = [];
    public DateTimeOffset Now { get; private set; }

    public void OnGet()
    {
        Now = plant.Now;
        // Worst first: stale, then most findings, then configuration order.
        Loops = plant.Loops()
            .Select((l, i) => (l, i))
            .OrderByDescending(x => x.l.Findings.Any(f => f.Kind == Analytics.Findings.FindingKinds.Stale))
            .ThenByDescending(x => x.l.Findings.Count)
            .ThenBy(x => x.i)
            .Select(x => x.l)
            .ToList();
    }
}

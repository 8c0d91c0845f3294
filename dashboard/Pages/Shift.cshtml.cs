using LoopWatch.Dashboard.Model;
using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage.Reading;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>The shift handover: alarms raised and cleared, alarms that changed state and operator comments in one shift.</summary>
public sealed class ShiftModel(IPlantView plant, IAlarmView alarms, StorageReader reader, ShiftSchedule schedule) : PageModel
{
    public ShiftReport? Report { get; private set; }
    public bool Previous { get; private set; }
    public DateTimeOffset Now { get; private set; }
    public ShiftSchedule Schedule => schedule;

    /// <summary>Active alarms at the time of the page (shown for the current shift as the hand-over list).</summary>
    public IReadOnlyList<AlarmView> ActiveNow { get; private set; } = [];

    /// <summary>Loop id to area, for the changes table.</summary>
    public IReadOnlyDictionary<string, string> Areas { get; private set; } = new Dictionary<string, string>();

    public async Task<IActionResult> OnGetAsync(string? shift, CancellationToken ct)
    {
        if (shift is not (null or "" or "current" or "previous")) return BadRequest("shift must be current or previous");
        Previous = shift == "previous";
        Now = plant.Now;
        var window = schedule.At(Now);
        if (Previous) window = schedule.Previous(window);
        var rows = await reader.ReadJournalAsync(new JournalQuery(window.Start.ToUnixTimeMilliseconds(), window.End.ToUnixTimeMilliseconds(),
            Limit: 100_000, OldestFirst: true), ct);
        Report = ShiftReport.Compute(rows, window);
        // Suppressed-by-design alarms follow from another alarm; they are not part of what the next shift must know.
        ActiveNow = Previous ? [] : alarms.Alarms(activeOnly: true).Where(a => a.State != "suppressed-by-design").ToList();
        var areas = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var l in plant.Loops()) areas.TryAdd(l.Id, l.Area);
        Areas = areas;
        return Page();
    }
}

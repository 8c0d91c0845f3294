using System.Globalization;
using System.Text;
using LoopWatch.Dashboard.Model;
using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage;
using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Schema;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>The weekly summary of loop health against the week before, as a page (printable on A4) and as CSV.</summary>
public sealed class WeeklyModel(IPlantView plant, StorageReader reader, ShiftSchedule schedule, WeeklySources sources) : PageModel
{
    /// <summary>Other agents' databases that could not be read for this page, with the reason.</summary>
    public List<string> NotIncluded { get; } = [];

    /// <summary>How many databases the figures come from.</summary>
    public int Databases => _readers?.Count ?? 1;

    private List<StorageReader>? _readers;
    private IReadOnlyList<KeyValuePair<string, string>>? _areas;

    public WeekOverWeek? Summary { get; private set; }
    public DateTimeOffset Now { get; private set; }
    public bool IsComplete { get; private set; }

    /// <summary>The week's top offenders with the advice their loops have now.</summary>
    public IReadOnlyList<OffenderAdvice> Advice { get; private set; } = [];

    public async Task<IActionResult> OnGetAsync(string? week, CancellationToken ct)
    {
        if (!TryWeek(week, out var w)) return BadRequest("week must be a date yyyy-MM-dd (the Monday of an ISO week)");
        var current = await SummaryAsync(w, ct);
        if (string.IsNullOrEmpty(week) && current.Hours == 0)
        {
            // A new installation has no complete week yet: show the week so far rather than an empty page.
            var thisWeek = ReportWeek.Containing(DateOnly.FromDateTime(TimeZoneInfo.ConvertTime(Now, schedule.Zone).DateTime), schedule.Zone);
            var soFar = await SummaryAsync(thisWeek, ct);
            if (soFar.Hours > 0) (w, current) = (thisWeek, soFar);
        }
        Summary = new WeekOverWeek(current, await SummaryAsync(w.Before(), ct));
        IsComplete = w.End <= Now;
        Advice = OffenderAdvice.For(current, id => plant.Loop(id)?.Statistics.Advice);
        return Page();
    }

    public async Task<IActionResult> OnGetCsvAsync(string? week, CancellationToken ct)
    {
        if (!TryWeek(week, out var w)) return BadRequest("week must be a date yyyy-MM-dd (the Monday of an ISO week)");
        var csv = WeeklyCsv.Write(await SummaryAsync(w, ct));
        return File(Encoding.UTF8.GetBytes(csv), "text/csv; charset=utf-8", $"loopwatch-week-{w.Key}.csv");
    }

    // A given date snaps to the Monday of its ISO week; none means the last complete week in plant time.
    private bool TryWeek(string? text, out ReportWeek week)
    {
        Now = plant.Now;
        week = ReportWeek.LastComplete(Now, schedule.Zone);
        if (string.IsNullOrEmpty(text)) return true;
        if (!DateOnly.TryParseExact(text, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var day)) return false;
        week = ReportWeek.Containing(day, schedule.Zone);
        return true;
    }

    private Task<WeeklySummary> SummaryAsync(ReportWeek w, CancellationToken ct) =>
        WeeklyRead.SummaryAsync(Readers(), w,
            _areas ??= sources.Areas.Count > 0 ? sources.Areas : plant.Loops().Select(l => KeyValuePair.Create(l.Id, l.Area)).ToList(), ct);

    // This agent's database, and the other shards' opened read-only once per request (a page reads up to three weeks)
    // and closed with the response; one that cannot be read is named on the page and left out, so a stopped or moved
    // agent never takes the whole summary down.
    private List<StorageReader> Readers()
    {
        if (_readers is not null) return _readers;
        _readers = [reader];
        foreach (var path in sources.Databases)
        {
            try
            {
                var database = LoopWatchDatabase.OpenReadOnly(path);
                HttpContext.Response.RegisterForDispose(database);
                _readers.Add(new StorageReader(database));
            }
            catch (Exception e) when (e is IOException or StorageSchemaException or UnauthorizedAccessException)
            {
                NotIncluded.Add(e.Message);
            }
        }
        return _readers;
    }
}

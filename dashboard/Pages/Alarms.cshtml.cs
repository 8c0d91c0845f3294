using System.Globalization;
using System.Text.Json;
using LoopWatch.Dashboard.Access;
using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Rows;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>
/// Active alarms with acknowledge and shelve forms (operator role), the stored journal filtered by loop, kind, state and
/// time range, and the alarm-system figures of the last 24 h of plant time.
/// </summary>
public sealed class AlarmsModel(IAlarmView alarms, IPlantView plant, StorageReader reader, IActionGuard guard, IAuthorizationService authorization)
    : PageModel
{
    /// <summary>The longest shelve an operator may set: a week, as the API allows.</summary>
    public const int MaxShelveMinutes = 7 * 24 * 60;

    /// <summary>Rows shown in the history at most.</summary>
    public const int HistoryLimit = 500;

    private const string TimeFormat = "yyyy-MM-ddTHH:mm";

    /// <summary>Every alarm state name, in the order of the state diagram.</summary>
    public static readonly string[] States =
        ["normal", "unacknowledged", "acknowledged", "returned-unacknowledged", "shelved", "suppressed-by-design", "out-of-service"];

    /// <summary>Alarms that need the operator: unacknowledged, acknowledged or returned-unacknowledged.</summary>
    public IReadOnlyList<AlarmView> Active { get; private set; } = [];

    /// <summary>Alarms taken out of the operator's list: shelved, suppressed by design, out of service.</summary>
    public IReadOnlyList<AlarmView> SetAside { get; private set; } = [];
    public IReadOnlyList<AlarmJournalEntry> History { get; private set; } = [];
    public AlarmHealthReport? Health { get; private set; }
    public IReadOnlyList<string> LoopIds { get; private set; } = [];
    public IReadOnlyList<string> Kinds { get; private set; } = [];
    public DateTimeOffset Now { get; private set; }
    public bool CanOperate { get; private set; }

    [TempData] public string? Notice { get; set; }
    public string? Refusal { get; private set; }

    [BindProperty(SupportsGet = true, Name = "loop")] public string? FilterLoop { get; set; }
    [BindProperty(SupportsGet = true, Name = "kind")] public string? FilterKind { get; set; }
    [BindProperty(SupportsGet = true, Name = "state")] public string? FilterState { get; set; }
    [BindProperty(SupportsGet = true, Name = "from")] public string? From { get; set; }
    [BindProperty(SupportsGet = true, Name = "to")] public string? To { get; set; }

    public string FromText { get; private set; } = "";
    public string ToText { get; private set; } = "";
    public string? FilterError { get; private set; }

    public async Task OnGetAsync(CancellationToken ct) => await LoadAsync(ct);

    public async Task<IActionResult> OnPostAcknowledgeAsync(string? id, string? comment, CancellationToken ct)
    {
        var user = await guard.AllowAsync(HttpContext, "acknowledge");
        if (user is null) return await RefuseAsync(ct);
        if (string.IsNullOrWhiteSpace(id)) return Back("Choose an alarm to acknowledge.");
        var r = alarms.Acknowledge(id, user, Clean(comment));
        return Back(r.Accepted ? $"{id} acknowledged by {user} ({r.From} → {r.To})." : $"{id} not acknowledged: {r.Refusal}");
    }

    public async Task<IActionResult> OnPostShelveAsync(string? id, string? minutes, string? comment, CancellationToken ct)
    {
        var user = await guard.AllowAsync(HttpContext, "shelve");
        if (user is null) return await RefuseAsync(ct);
        if (string.IsNullOrWhiteSpace(id)) return Back("Choose an alarm to shelve.");
        if (!int.TryParse(minutes, NumberStyles.None, CultureInfo.InvariantCulture, out var m) || m < 1 || m > MaxShelveMinutes)
            return Back($"{id} not shelved: minutes must be 1 to {MaxShelveMinutes}.");
        // ISA-18.2 shelving is a recorded decision, so the reason is required.
        if (Clean(comment) is not { } reason) return Back($"{id} not shelved: give a reason.");
        var r = alarms.Shelve(id, user, reason, TimeSpan.FromMinutes(m));
        return Back(r.Accepted ? $"{id} shelved for {m} min by {user}." : $"{id} not shelved: {r.Refusal}");
    }

    /// <summary>Short figures of an alarm's finding, e.g. "offset_pct 3.20"; numbers only, at most four.</summary>
    public static IReadOnlyList<(string Name, string Value)> Figures(string? json)
    {
        if (string.IsNullOrWhiteSpace(json)) return [];
        try
        {
            using var doc = JsonDocument.Parse(json);
            if (doc.RootElement.ValueKind != JsonValueKind.Object) return [];
            return doc.RootElement.EnumerateObject()
                .Where(p => p.Value.ValueKind == JsonValueKind.Number && p.Value.TryGetDouble(out _))
                .Take(4).Select(p => (p.Name, Format.Value(p.Value.GetDouble()))).ToList();
        }
        catch (JsonException)
        {
            return [];
        }
    }

    /// <summary>Is an alarm in this state in front of the operator (ISA-18.2: not shelved, suppressed or out of service)?</summary>
    public static bool Annunciated(string state) => state is "unacknowledged" or "acknowledged" or "returned-unacknowledged";

    /// <summary>May an alarm in this state be acknowledged?</summary>
    public static bool Acknowledgeable(string state) => state is "unacknowledged" or "returned-unacknowledged";

    /// <summary>May an alarm in this state be shelved?</summary>
    public static bool Shelvable(string state) => state is "normal" or "unacknowledged" or "acknowledged" or "returned-unacknowledged";

    private async Task LoadAsync(CancellationToken ct)
    {
        Now = plant.Now;
        CanOperate = (await authorization.AuthorizeAsync(User, Roles.CanOperate)).Succeeded;
        var notNormal = alarms.Alarms(activeOnly: true)
            .OrderBy(a => a.Priority switch { "high" => 0, "medium" => 1, _ => 2 })
            .ThenBy(a => a.Raised ?? DateTimeOffset.MaxValue).ToList();
        Active = notNormal.Where(a => Annunciated(a.State)).ToList();
        SetAside = notNormal.Where(a => !Annunciated(a.State)).ToList();
        var all = alarms.Alarms(activeOnly: false);
        LoopIds = plant.Loops().Select(l => l.Id).ToList();
        Kinds = all.Select(a => a.Kind).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
        Health = await alarms.HealthAsync(TimeSpan.FromHours(24), ct);

        var to = ParseTime(To) ?? Now.AddMinutes(1);
        var from = ParseTime(From) ?? to.AddHours(-24);
        if ((From is { Length: > 0 } && ParseTime(From) is null) || (To is { Length: > 0 } && ParseTime(To) is null))
            FilterError = $"Times are {TimeFormat} in UTC; the last 24 h are shown.";
        FromText = from.UtcDateTime.ToString(TimeFormat, CultureInfo.InvariantCulture);
        ToText = to.UtcDateTime.ToString(TimeFormat, CultureInfo.InvariantCulture);
        var state = States.Contains(FilterState) ? FilterState : null;
        // The journal query has no state column filter; read more rows and filter here.
        var rows = await reader.ReadJournalAsync(new JournalQuery(from.ToUnixTimeMilliseconds(), to.ToUnixTimeMilliseconds(),
            Blank(FilterLoop), Blank(FilterKind), Limit: state is null ? HistoryLimit : 20 * HistoryLimit), ct);
        History = rows.Where(r => state is null || r.ToState == state).Take(HistoryLimit).ToList();
    }

    // Not signed in: to the login form; signed in without the role: 403 with the page and a reason.
    private async Task<IActionResult> RefuseAsync(CancellationToken ct)
    {
        if (User.Identity?.IsAuthenticated != true) return Challenge();
        Response.StatusCode = StatusCodes.Status403Forbidden;
        await LoadAsync(ct);
        Refusal = "Refused: acknowledging and shelving need the operator role.";
        return Page();
    }

    private RedirectToPageResult Back(string notice)
    {
        Notice = notice;
        return RedirectToPage();
    }

    private static string? Blank(string? s) => string.IsNullOrWhiteSpace(s) ? null : s.Trim();

    private static string? Clean(string? s) => Blank(s) is { } t ? (t.Length > 500 ? t[..500] : t) : null;

    private static DateTimeOffset? ParseTime(string? s) =>
        DateTime.TryParseExact(s, [TimeFormat, "yyyy-MM-ddTHH:mm:ss", "yyyy-MM-dd"], CultureInfo.InvariantCulture,
            DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal, out var t)
            ? new DateTimeOffset(DateTime.SpecifyKind(t, DateTimeKind.Utc)) : null;
}

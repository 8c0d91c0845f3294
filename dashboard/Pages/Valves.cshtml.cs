using LoopWatch.Dashboard.Access;
using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>Maintenance view of the final elements: wear rates, counters since service, move sizes, days to service; records a service.</summary>
public sealed class ValvesModel(IValveView valves, IPlantView plant, IActionGuard guard, IAuthorizationService authorization) : PageModel
{
    public IReadOnlyList<ValveView> Valves { get; private set; } = [];
    public DateTimeOffset Now { get; private set; }
    public bool CanMaintain { get; private set; }
    public string? Notice { get; private set; }
    public string? Refusal { get; private set; }

    public async Task OnGetAsync(string? notice) => await LoadAsync(notice);

    public async Task<IActionResult> OnPostServiceAsync(string? loop, string? element, string? note)
    {
        var user = await guard.AllowAsync(HttpContext, "service");
        if (user is null)
        {
            if (User.Identity?.IsAuthenticated != true) return Challenge();
            Response.StatusCode = StatusCodes.Status403Forbidden;
            await LoadAsync(null);
            Refusal = "Refused: recording a service needs the maintenance role.";
            return Page();
        }
        var text = string.IsNullOrWhiteSpace(note) ? null : note.Trim()[..Math.Min(500, note.Trim().Length)];
        var ok = loop is not null && element is not null && valves.RecordService(loop, element, user, text);
        return RedirectToPage(new { notice = ok ? $"Service recorded on {loop} {element} by {user}; a new counting period starts." : "No such element." });
    }

    private async Task LoadAsync(string? notice)
    {
        Now = plant.Now;
        Valves = valves.Valves();
        Notice = notice;
        CanMaintain = (await authorization.AuthorizeAsync(User, Roles.CanMaintain)).Succeeded;
    }
}

using Microsoft.AspNetCore.Http;

namespace LoopWatch.Dashboard.Model;

/// <summary>Decides whether a request may perform a change (acknowledge, shelve, record a service, manage users) and as whom.</summary>
public interface IActionGuard
{
    /// <summary>The acting user's name when <paramref name="context"/> may perform <paramref name="action"/>; null when refused.</summary>
    Task<string?> AllowAsync(HttpContext context, string action);
}

using Microsoft.AspNetCore.Http;

namespace LoopWatch.Dashboard.Model;

/// <summary>Decides whether a request may act on alarms (operator role) and under which user name.</summary>
public interface IActionGuard
{
    /// <summary>True with the acting user's name when <paramref name="context"/> may perform <paramref name="action"/>.</summary>
    bool Allows(HttpContext context, string action, out string user);
}

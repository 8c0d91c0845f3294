using Microsoft.AspNetCore.Http;

namespace LoopWatch.Dashboard.Model;

/// <summary>The guard until a login is configured: no request may act on alarms.</summary>
public sealed class DenyAllGuard : IActionGuard
{
    /// <inheritdoc />
    public bool Allows(HttpContext context, string action, out string user)
    {
        user = "";
        return false;
    }
}

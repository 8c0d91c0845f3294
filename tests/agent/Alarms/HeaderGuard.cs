using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Http;

namespace LoopWatch.Agent.Tests.Alarms;

/// <summary>Test guard: a request carrying <c>X-Test-Operator: name</c> acts as that operator; anything else is refused.</summary>
public sealed class HeaderGuard : IActionGuard
{
    public Task<string?> AllowAsync(HttpContext context, string action)
    {
        var user = context.Request.Headers["X-Test-Operator"].ToString();
        return Task.FromResult<string?>(user.Length > 0 ? user : null);
    }
}

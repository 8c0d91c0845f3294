using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Antiforgery;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Http;

namespace LoopWatch.Dashboard.Access;

/// <summary>
/// The guard of every change: a signed-in user whose role allows the action, and a valid anti-forgery token
/// (form field or the <see cref="DashboardSetup.TokenHeader"/> header).
/// </summary>
public sealed class RoleGuard(IAuthorizationService authorization, IAntiforgery antiforgery) : IActionGuard
{
    /// <summary>The policy each action needs.</summary>
    public static string PolicyFor(string action) => action switch
    {
        "acknowledge" or "shelve" or "comment" or "out-of-service" or "return-to-service" => Roles.CanOperate,
        "service" => Roles.CanMaintain,
        _ => Roles.CanAdminister,
    };

    /// <inheritdoc />
    public async Task<string?> AllowAsync(HttpContext context, string action)
    {
        var user = context.User;
        if (user.Identity is not { IsAuthenticated: true, Name: { Length: > 0 } name }) return null;
        if (!(await authorization.AuthorizeAsync(user, PolicyFor(action))).Succeeded) return null;
        if (!await antiforgery.IsRequestValidAsync(context)) return null;
        return name;
    }
}

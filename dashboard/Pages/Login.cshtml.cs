using System.Security.Claims;
using LoopWatch.Dashboard.Access;
using LoopWatch.Storage.Users;
using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.Authentication.Cookies;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>Cookie sign-in against the users table, throttled per user name; sign-out by POST.</summary>
public sealed class LoginModel(UserStore users, LoginThrottle throttle) : PageModel
{
    public string? Error { get; private set; }
    public string? UserName { get; private set; }
    public string ReturnUrl { get; private set; } = "/";

    public void OnGet(string? returnUrl) => ReturnUrl = SafeReturn(returnUrl);

    public async Task<IActionResult> OnPostAsync(string? user, string? password, string? returnUrl, CancellationToken ct)
    {
        UserName = user;
        ReturnUrl = SafeReturn(returnUrl);
        if (string.IsNullOrWhiteSpace(user) || string.IsNullOrEmpty(password)) { Error = "Enter user and password."; return Page(); }
        if (throttle.IsLocked(user))
        {
            Error = "Too many failed attempts; try again in 15 minutes.";
            Response.StatusCode = StatusCodes.Status429TooManyRequests;
            return Page();
        }
        var row = await users.FindAsync(user, ct);
        if (row is not { } u || !Passwords.Verify(u.Name, u.PasswordHash, password))
        {
            throttle.Failed(user);
            Error = "User or password is wrong.";
            Response.StatusCode = StatusCodes.Status401Unauthorized;
            return Page();
        }
        throttle.Succeeded(user);
        var identity = new ClaimsIdentity([new Claim(ClaimTypes.Name, u.Name), new Claim(ClaimTypes.Role, u.Role)], CookieAuthenticationDefaults.AuthenticationScheme);
        await HttpContext.SignInAsync(CookieAuthenticationDefaults.AuthenticationScheme, new ClaimsPrincipal(identity));
        return LocalRedirect(ReturnUrl);
    }

    public async Task<IActionResult> OnPostLogoutAsync()
    {
        await HttpContext.SignOutAsync(CookieAuthenticationDefaults.AuthenticationScheme);
        return LocalRedirect("/");
    }

    private string SafeReturn(string? url) => !string.IsNullOrEmpty(url) && Url.IsLocalUrl(url) ? url : "/";
}

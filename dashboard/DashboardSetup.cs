using LoopWatch.Dashboard.Access;
using LoopWatch.Dashboard.Api;
using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage;
using LoopWatch.Storage.Users;
using Microsoft.AspNetCore.Authentication.Cookies;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.DataProtection;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Routing;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;

namespace LoopWatch.Dashboard;

/// <summary>Adds the dashboard's pages and HTTP API to a host; the host provides an <see cref="Model.IPlantView"/> and the storage services.</summary>
public static class DashboardSetup
{
    /// <summary>The header that carries the anti-forgery token on API calls that change something.</summary>
    public const string TokenHeader = "X-LoopWatch-Token";

    private static readonly Lazy<string> Css = new(() => Asset("site.css"));

    /// <summary>Registers Razor Pages, cookie login with roles, anti-forgery, persisted data-protection keys and the shift
    /// schedule (<paramref name="shifts"/>, else one the host registered, else <see cref="ShiftSchedule.Default"/>).</summary>
    public static IServiceCollection AddLoopWatchDashboard(this IServiceCollection services, DashboardAccess access, string keysDirectory,
        ShiftSchedule? shifts = null)
    {
        services.AddSingleton(access);
        services.TryAddSingleton(WeeklySources.OwnOnly);
        if (shifts is not null) services.AddSingleton(shifts);
        else services.TryAddSingleton(ShiftSchedule.Default);
        // The login page needs the users table; a host that registers its own store keeps it.
        services.TryAddSingleton(sp => new UserStore(sp.GetRequiredService<LoopWatchDatabase>()));
        services.AddSingleton<LoginThrottle>();
        // Keys on disk so a restart of the agent does not log everybody out.
        services.AddDataProtection().PersistKeysToFileSystem(new DirectoryInfo(keysDirectory)).SetApplicationName("LoopWatch");
        services.AddAntiforgery(o =>
        {
            o.HeaderName = TokenHeader;
            o.Cookie.Name = "loopwatch.af";
            o.Cookie.SameSite = SameSiteMode.Strict;
        });
        services.AddAuthentication(CookieAuthenticationDefaults.AuthenticationScheme).AddCookie(o =>
        {
            o.Cookie.Name = "loopwatch.auth";
            o.Cookie.HttpOnly = true;
            o.Cookie.SameSite = SameSiteMode.Strict;
            o.LoginPath = "/login";
            o.AccessDeniedPath = "/login";
            o.ExpireTimeSpan = TimeSpan.FromHours(12); // one long shift
            o.SlidingExpiration = true;
            // API callers get status codes, not a redirect to the login form.
            o.Events.OnRedirectToLogin = c => Deny(c, StatusCodes.Status401Unauthorized);
            o.Events.OnRedirectToAccessDenied = c => Deny(c, StatusCodes.Status403Forbidden);
        });
        services.AddAuthorizationBuilder()
            .AddPolicy(Roles.CanView, p => { if (access.RequireLoginToView) p.RequireAuthenticatedUser(); else p.RequireAssertion(_ => true); })
            .AddPolicy(Roles.CanOperate, p => p.RequireRole(Roles.Operator, Roles.Admin))
            .AddPolicy(Roles.CanMaintain, p => p.RequireRole(Roles.Maintenance, Roles.Admin))
            .AddPolicy(Roles.CanAdminister, p => p.RequireRole(Roles.Admin));
        services.AddRazorPages(o =>
            {
                o.Conventions.AuthorizeFolder("/", Roles.CanView);
                o.Conventions.AllowAnonymousToPage("/Login");
            })
            .AddApplicationPart(typeof(DashboardSetup).Assembly);
        return services;
    }

    /// <summary>Maps the pages, <c>/api/...</c> and <c>/healthz</c>.</summary>
    public static IEndpointRouteBuilder MapLoopWatchDashboard(this WebApplication app)
    {
        app.Use(SecurityHeaders.Apply);
        app.UseAuthentication();
        app.UseAuthorization();
        app.MapGet("/assets/site.css", () => Results.Text(Css.Value, "text/css")).AllowAnonymous();
        app.MapRazorPages();
        // Same-origin scripts and API clients fetch a token for the signed-in user here; other origins cannot read it.
        app.MapGet("/api/token", (Microsoft.AspNetCore.Antiforgery.IAntiforgery af, HttpContext c) =>
            Results.Json(new { token = af.GetAndStoreTokens(c).RequestToken, header = TokenHeader }));
        LoopApi.Map(app);
        AlarmApi.Map(app);
        return app;
    }

    private static Task Deny(Microsoft.AspNetCore.Authentication.RedirectContext<CookieAuthenticationOptions> c, int status)
    {
        if (c.Request.Path.StartsWithSegments("/api")) c.Response.StatusCode = status;
        else c.Response.Redirect(c.RedirectUri);
        return Task.CompletedTask;
    }

    private static string Asset(string name)
    {
        using var stream = typeof(DashboardSetup).Assembly.GetManifestResourceStream($"LoopWatch.Dashboard.Assets.{name}")
            ?? throw new InvalidOperationException($"asset {name} is not embedded");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }
}

using LoopWatch.Dashboard.Api;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Routing;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard;

/// <summary>Adds the dashboard's pages and HTTP API to a host; the host provides an <see cref="Model.IPlantView"/>.</summary>
public static class DashboardSetup
{
    /// <summary>Registers Razor Pages from this assembly.</summary>
    public static IServiceCollection AddLoopWatchDashboard(this IServiceCollection services)
    {
        services.AddRazorPages().AddApplicationPart(typeof(DashboardSetup).Assembly);
        return services;
    }

    /// <summary>Maps the pages, <c>/api/...</c> and <c>/healthz</c>.</summary>
    public static IEndpointRouteBuilder MapLoopWatchDashboard(this WebApplication app)
    {
        app.MapGet("/assets/site.css", () => Results.Text(Asset("site.css"), "text/css"));
        app.MapRazorPages();
        LoopApi.Map(app);
        AlarmApi.Map(app);
        return app;
    }

    private static string Asset(string name)
    {
        using var stream = typeof(DashboardSetup).Assembly.GetManifestResourceStream($"LoopWatch.Dashboard.Assets.{name}")
            ?? throw new InvalidOperationException($"asset {name} is not embedded");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }
}

using LoopWatch.Dashboard.Access;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.DependencyInjection;
using Prometheus;

namespace LoopWatch.Agent.Metrics;

/// <summary>Maps <c>GET /metrics</c> (Prometheus text format) on the dashboard host by <c>Dashboard:MetricsAccess</c>.</summary>
public static class MetricsEndpoint
{
    /// <summary>The path scrapers read.</summary>
    public const string Path = "/metrics";

    /// <summary><c>viewing</c>: as the pages (login only with RequireLoginToView); <c>open</c>: always anonymous; <c>off</c>: not mapped.</summary>
    public static void Map(WebApplication app, string access)
    {
        if (access == "off") return;
        var registry = app.Services.GetRequiredService<AgentMetrics>().Registry;
        var endpoint = app.MapMetrics(Path, registry);
        if (access == "open") endpoint.AllowAnonymous();
        else endpoint.RequireAuthorization(Roles.CanView);
    }
}

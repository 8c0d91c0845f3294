using LoopWatch.Dashboard.Api;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Http;

namespace LoopWatch.Agent.Sparkplug;

/// <summary>The read-only endpoint <c>/api/sparkplug</c>: the reader's counters and the edge nodes it follows.</summary>
public static class SparkplugApi
{
    /// <summary>Maps <c>GET /api/sparkplug</c>.</summary>
    public static void Map(WebApplication app) =>
        app.MapGet("/api/sparkplug", (SparkplugReader reader) =>
            Results.Json(new { counters = reader.Counters(), nodes = reader.Nodes() }, ApiJson.Options));
}

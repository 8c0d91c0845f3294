using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Http;

namespace LoopWatch.Dashboard.Api;

/// <summary>Read-only endpoints on the loops and the agent's health.</summary>
public static class LoopApi
{
    /// <summary>Maps <c>/api/loops</c>, <c>/api/loops/{id}</c> and <c>/healthz</c>.</summary>
    public static void Map(WebApplication app)
    {
        app.MapGet("/api/loops", (IPlantView plant) =>
            Results.Json(plant.Loops().Select(LoopJson.From).ToArray(), ApiJson.Options));
        app.MapGet("/api/loops/{id}", (string id, IPlantView plant) =>
            plant.Loop(id) is { } v ? Results.Json(LoopJson.From(v), ApiJson.Options) : Results.NotFound());
        app.MapGet("/healthz", (IPlantView plant, IServiceProvider services) =>
        {
            var c = plant.Counters();
            // A storage fault leaves the agent analysing (200) but says so: status "degraded" and the writer's state.
            var storage = (services.GetService(typeof(IStorageHealth)) as IStorageHealth)?.Current();
            var status = storage?.Fault is null ? "ok" : "degraded";
            return Results.Json(new { status, plant_time = plant.Now, ingest = c, storage }, ApiJson.Options);
        });
    }
}

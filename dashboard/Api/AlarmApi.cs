using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Http;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Api;

/// <summary>
/// Alarm endpoints: list, journal since a time, acknowledge and shelve (operator role through <see cref="IActionGuard"/>),
/// and alarm-system health. Mapped only when the host provides an <see cref="IAlarmView"/>.
/// </summary>
public static class AlarmApi
{
    /// <summary>The body of an acknowledge or shelve request.</summary>
    public sealed record ActionBody(string? User, string? Comment, double? Minutes);

    /// <summary>Maps <c>/api/alarms</c>, <c>/api/alarms/{id}/ack</c>, <c>/api/alarms/{id}/shelve</c> and <c>/api/alarm-health</c>.</summary>
    public static void Map(WebApplication app)
    {
        if (app.Services.GetService<IAlarmView>() is null) return;
        app.MapGet("/api/alarms", (string? state, DateTimeOffset? since, IAlarmView alarms) =>
        {
            if (state is not (null or "active" or "all")) return Results.BadRequest(new { error = "state must be active or all" });
            var list = alarms.Alarms(activeOnly: state != "all");
            var journal = since is { } s ? alarms.Transitions(s) : null;
            return Results.Json(new { alarms = list, transitions = journal }, ApiJson.Options);
        });
        app.MapPost("/api/alarms/{id}/ack", (string id, ActionBody? body, HttpContext http, IAlarmView alarms, IActionGuard guard) =>
            Act(http, guard, "acknowledge", body, user => alarms.Acknowledge(RouteId(id), user, body?.Comment)));
        app.MapPost("/api/alarms/{id}/shelve", (string id, ActionBody? body, HttpContext http, IAlarmView alarms, IActionGuard guard) =>
        {
            if (body?.Minutes is not { } minutes || !(minutes > 0 && minutes <= 7 * 24 * 60))
                return Task.FromResult(Results.BadRequest(new { error = "minutes must be above 0 and at most 10080 (a week)" }));
            return Act(http, guard, "shelve", body, user => alarms.Shelve(RouteId(id), user, body.Comment, TimeSpan.FromMinutes(minutes)));
        });
        app.MapGet("/api/alarm-health", async (double? hours, IAlarmView alarms, CancellationToken ct) =>
        {
            var window = TimeSpan.FromHours(hours is > 0 and <= 24 * 400 ? hours.Value : 24);
            return Results.Json(await alarms.HealthAsync(window, ct), ApiJson.Options);
        });
    }

    // The router decodes every escape in a path segment but %2F, which would split the path: a loop id may hold a '/'.
    private static string RouteId(string id) => id.Replace("%2F", "/", StringComparison.OrdinalIgnoreCase);

    private static async Task<IResult> Act(HttpContext http, IActionGuard guard, string action, ActionBody? body, Func<string, AlarmActionView> act)
    {
        var user = await guard.AllowAsync(http, action);
        if (user is null) return Results.Json(new { error = "operator role required" }, ApiJson.Options, statusCode: 403);
        // The guard's identity wins; the body's user is taken only when the guard does not name one.
        var who = string.IsNullOrWhiteSpace(user) ? body?.User : user;
        if (string.IsNullOrWhiteSpace(who)) return Results.BadRequest(new { error = "user is required" });
        var result = act(who);
        return Results.Json(result, ApiJson.Options, statusCode: result.Accepted ? 200 : 409);
    }
}

using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using System.Text.RegularExpressions;
using LoopWatch.Agent;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Dashboard.Access;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Users;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Access;

public sealed partial class AccessTests
{
    private static async Task<RunningAgent> AgentWithUsers(params (string Name, string Role)[] users)
    {
        var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-950")], embedded: true, brokerPort: FreePort.Next());
        var store = agent.App.Services.GetRequiredService<UserStore>();
        foreach (var (name, role) in users) await store.AddAsync(new UserRow(name, role, Passwords.Hash(name, "correct horse 9"), 0));
        return agent;
    }

    private static HttpClient Browserless(RunningAgent agent) =>
        new(new HttpClientHandler { CookieContainer = new CookieContainer(), AllowAutoRedirect = false }) { BaseAddress = agent.Http.BaseAddress };

    private static async Task<HttpResponseMessage> SignIn(HttpClient http, string user, string password)
    {
        var form = await http.GetStringAsync("/login");
        var token = TokenField().Match(form).Groups[1].Value;
        return await http.PostAsync("/login", new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["user"] = user, ["password"] = password, ["__RequestVerificationToken"] = token,
        }));
    }

    private static async Task<string> ApiToken(HttpClient http) =>
        (await http.GetFromJsonAsync<JsonElement>("/api/token")).GetProperty("token").GetString()!;

    private static Task<HttpResponseMessage> Ack(HttpClient http, string? token)
    {
        var request = new HttpRequestMessage(HttpMethod.Post, "/api/alarms/FIC-950:stale/ack") { Content = JsonContent.Create(new { comment = "seen" }) };
        if (token is not null) request.Headers.Add(DashboardSetup.TokenHeader, token);
        return http.SendAsync(request);
    }

    [Fact]
    public async Task A_right_password_signs_in_and_a_wrong_one_is_refused()
    {
        await using var agent = await AgentWithUsers(("ria", Roles.Operator));
        using var http = Browserless(agent);
        Assert.Equal(HttpStatusCode.Unauthorized, (await SignIn(http, "ria", "wrong password")).StatusCode);
        var ok = await SignIn(http, "ria", "correct horse 9");
        Assert.Equal(HttpStatusCode.Redirect, ok.StatusCode);
        Assert.Contains(ok.Headers.GetValues("Set-Cookie"), c => c.StartsWith("loopwatch.auth=", StringComparison.Ordinal) && c.Contains("httponly", StringComparison.OrdinalIgnoreCase));
    }

    [Fact]
    public async Task Login_is_throttled_after_five_failures()
    {
        await using var agent = await AgentWithUsers(("ria", Roles.Operator));
        using var http = Browserless(agent);
        for (var i = 0; i < LoginThrottle.MaxFailures; i++) Assert.Equal(HttpStatusCode.Unauthorized, (await SignIn(http, "ria", "guess" + i)).StatusCode);
        // Even the right password is refused while the name is locked.
        Assert.Equal((HttpStatusCode)429, (await SignIn(http, "ria", "correct horse 9")).StatusCode);
    }

    [Fact]
    public async Task Acknowledge_is_refused_without_login_without_token_and_for_a_viewer()
    {
        await using var agent = await AgentWithUsers(("ria", Roles.Operator), ("vic", Roles.Viewer));
        using (var anonymous = Browserless(agent))
            Assert.Equal(HttpStatusCode.Forbidden, (await Ack(anonymous, null)).StatusCode);

        using (var viewer = Browserless(agent))
        {
            await SignIn(viewer, "vic", "correct horse 9");
            Assert.Equal(HttpStatusCode.Forbidden, (await Ack(viewer, await ApiToken(viewer))).StatusCode);
        }

        using var operatorClient = Browserless(agent);
        await SignIn(operatorClient, "ria", "correct horse 9");
        Assert.Equal(HttpStatusCode.Forbidden, (await Ack(operatorClient, null)).StatusCode);
        Assert.Equal(HttpStatusCode.Forbidden, (await Ack(operatorClient, "forged-token")).StatusCode);
        // With login, role and token the request reaches the alarm engine: there is no stale alarm on the loop, so the
        // state table refuses it (409) instead of the guard (403).
        var allowed = await Ack(operatorClient, await ApiToken(operatorClient));
        Assert.NotEqual(HttpStatusCode.Forbidden, allowed.StatusCode);
    }

    [Fact]
    public async Task Shelve_through_the_api_is_refused_without_login_without_token_and_for_a_viewer()
    {
        await using var agent = await AgentWithUsers(("ria", Roles.Operator), ("vic", Roles.Viewer));
        static Task<HttpResponseMessage> Shelve(HttpClient http, string? token)
        {
            var request = new HttpRequestMessage(HttpMethod.Post, "/api/alarms/FIC-950:stale/shelve") { Content = JsonContent.Create(new { comment = "work permit 12", minutes = 30 }) };
            if (token is not null) request.Headers.Add(DashboardSetup.TokenHeader, token);
            return http.SendAsync(request);
        }
        using (var anonymous = Browserless(agent))
            Assert.Equal(HttpStatusCode.Forbidden, (await Shelve(anonymous, await ApiToken(anonymous))).StatusCode);
        using (var viewer = Browserless(agent))
        {
            await SignIn(viewer, "vic", "correct horse 9");
            Assert.Equal(HttpStatusCode.Forbidden, (await Shelve(viewer, await ApiToken(viewer))).StatusCode);
        }
        using var op = Browserless(agent);
        await SignIn(op, "ria", "correct horse 9");
        Assert.Equal(HttpStatusCode.Forbidden, (await Shelve(op, null)).StatusCode);
        Assert.Equal(HttpStatusCode.Forbidden, (await Shelve(op, "forged-token")).StatusCode);
        Assert.NotEqual(HttpStatusCode.Forbidden, (await Shelve(op, await ApiToken(op))).StatusCode); // reaches the engine
    }

    [Fact]
    public async Task Adding_a_user_is_refused_without_login_without_token_and_below_admin()
    {
        await using var agent = await AgentWithUsers(("ria", Roles.Operator), ("ada", Roles.Admin));
        var store = agent.App.Services.GetRequiredService<UserStore>();
        Dictionary<string, string> Form(string? token)
        {
            var f = new Dictionary<string, string> { ["name"] = "mallory", ["role"] = Roles.Admin, ["password"] = "long enough pw 1" };
            if (token is not null) f["__RequestVerificationToken"] = token;
            return f;
        }
        using (var anonymous = Browserless(agent))
        {
            var token = TokenField().Match(await anonymous.GetStringAsync("/login")).Groups[1].Value;
            var r = await anonymous.PostAsync("/users?handler=Add", new FormUrlEncodedContent(Form(token)));
            Assert.Equal(HttpStatusCode.Redirect, r.StatusCode);
            Assert.Contains("/login", r.Headers.Location!.ToString());
        }
        using (var op = Browserless(agent))
        {
            await SignIn(op, "ria", "correct horse 9");
            var token = TokenField().Match(await op.GetStringAsync("/login")).Groups[1].Value;
            // A page answers a signed-in user without the role by sending the browser to the sign-in form (access denied).
            var r = await op.PostAsync("/users?handler=Add", new FormUrlEncodedContent(Form(token)));
            Assert.Equal(HttpStatusCode.Redirect, r.StatusCode);
            Assert.Contains("/login", r.Headers.Location!.ToString());
        }
        using (var admin = Browserless(agent))
        {
            await SignIn(admin, "ada", "correct horse 9");
            Assert.Equal(HttpStatusCode.BadRequest, (await admin.PostAsync("/users?handler=Add", new FormUrlEncodedContent(Form(null)))).StatusCode);
        }
        Assert.Null(await store.FindAsync("mallory")); // none of the refused requests added the user
    }

    [Fact]
    public async Task Every_answer_carries_the_security_headers()
    {
        await using var agent = await AgentWithUsers();
        var response = await agent.Http.GetAsync("/");
        var csp = string.Join(";", response.Headers.GetValues("Content-Security-Policy"));
        Assert.Contains("script-src 'self'", csp);
        Assert.DoesNotContain("unsafe-inline", csp);
        Assert.Contains("frame-ancestors 'none'", csp);
        Assert.Equal("DENY", response.Headers.GetValues("X-Frame-Options").Single());
        Assert.Equal("nosniff", response.Headers.GetValues("X-Content-Type-Options").Single());
    }

    [Fact]
    public async Task User_add_stores_a_hashed_password_and_refuses_an_unknown_role()
    {
        var dir = Directory.CreateTempSubdirectory("lw-user-").FullName;
        var err = new StringWriter();
        Assert.Equal(2, await Cli.RunAsync(["user", "add", "mo", "--role", "superuser", "--data-dir", dir], new StringWriter(), err, stdin: new StringReader("long enough pw\n")));
        Assert.Contains("--role", err.ToString());
        Assert.Equal(0, await Cli.RunAsync(["user", "add", "mo", "--role", "maintenance", "--data-dir", dir], new StringWriter(), new StringWriter(), stdin: new StringReader("long enough pw\n")));
        using var db = Storage.LoopWatchDatabase.Open(Path.Combine(dir, "loopwatch.db"));
        var row = await new UserStore(db).FindAsync("mo");
        Assert.Equal("maintenance", row!.Value.Role);
        Assert.DoesNotContain("long enough pw", row.Value.PasswordHash);
        Assert.True(Passwords.Verify("mo", row.Value.PasswordHash, "long enough pw"));
    }

    [GeneratedRegex("name=\"__RequestVerificationToken\" type=\"hidden\" value=\"([^\"]+)\"")]
    private static partial Regex TokenField();
}

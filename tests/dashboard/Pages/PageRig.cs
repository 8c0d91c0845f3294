using System.Net;
using System.Text.RegularExpressions;
using LoopWatch.Agent.Storage;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Analytics.Configuration;
using LoopWatch.Dashboard.Access;
using LoopWatch.Dashboard.Model;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Users;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Playwright;
using MQTTnet;

namespace LoopWatch.Dashboard.Tests.Pages;

/// <summary>Shared steps of the page tests: an agent with a stale alarm, users, sign-in in the browser and by plain HTTP.</summary>
public static partial class PageRig
{
    public const string Password = "correct horse battery staple";

    /// <summary>A test loop that goes stale 2 s after its last sample and alarms at once.</summary>
    public static LoopOptions FastStale(string id, string area = "Test area")
    {
        var o = TestLoops.Pid(id);
        o.Area = area;
        o.Limits = new LimitOptions { StaleSeconds = 2 };
        o.Alarms = new AlarmOptions { OnDelaySeconds = 0, OffDelaySeconds = 0 };
        return o;
    }

    /// <summary>Starts the real agent with the loops, feeds each one sample over MQTT and waits for their stale alarms.</summary>
    public static async Task<RunningAgent> StartWithStaleAlarmsAsync(params LoopOptions[] loops)
    {
        var port = FreePort.Next();
        var agent = await RunningAgent.StartAsync(loops, embedded: true, brokerPort: port);
        using var client = new MqttClientFactory().CreateMqttClient();
        await client.ConnectAsync(new MqttClientOptionsBuilder().WithTcpServer("127.0.0.1", port).Build());
        await agent.UntilSubscribedAsync("subscribed");
        var ts = DateTimeOffset.UtcNow.ToString("O");
        foreach (var l in loops)
        {
            foreach (var (tag, v) in new[] { ("pv", 100.0), ("sp", 100.0), ("op", 40.0) })
                await client.PublishStringAsync($"test/{l.Id}/{tag}", $$"""{"value": {{v}}, "timestamp": "{{ts}}"}""");
            await client.PublishStringAsync($"test/{l.Id}/mode", "auto");
        }
        var alarms = agent.App.Services.GetRequiredService<IAlarmView>();
        await Eventually.Until(() => Task.FromResult(alarms.Alarms(activeOnly: true).Count(a => a.Kind == "stale")), n => n == loops.Length,
            what: "stale alarms on every loop");
        await FlushAsync(agent);
        return agent;
    }

    /// <summary>Waits until every journal row and state posted so far is in the database.</summary>
    public static Task FlushAsync(RunningAgent agent) => agent.App.Services.GetRequiredService<AgentStorage>().Writer.FlushAsync();

    public static async Task AddUserAsync(RunningAgent agent, string name, string role) =>
        Assert.True(await agent.App.Services.GetRequiredService<UserStore>().AddAsync(new UserRow(name, role, Passwords.Hash(name, Password), 0)));

    public static async Task SignInAsync(IPage page, RunningAgent agent, string user, string returnUrl)
    {
        await page.GotoAsync(agent.Http.BaseAddress + "login?returnUrl=" + Uri.EscapeDataString(returnUrl));
        await page.FillAsync("input[name=user]", user);
        await page.FillAsync("input[name=password]", Password);
        await page.ClickAsync("form.login button[type=submit]");
        await page.WaitForURLAsync(agent.Http.BaseAddress + returnUrl.TrimStart('/'));
    }

    /// <summary>A client of its own cookies that does not follow redirects, so refusals are seen as they are.</summary>
    public static HttpClient Client(RunningAgent agent) =>
        new(new HttpClientHandler { CookieContainer = new CookieContainer(), AllowAutoRedirect = false }) { BaseAddress = agent.Http.BaseAddress };

    /// <summary>The anti-forgery token of the first form on a page (its cookie lands in the client).</summary>
    public static async Task<string> TokenAsync(HttpClient client, string path)
    {
        var html = await client.GetStringAsync(path);
        var m = TokenField().Match(html);
        Assert.True(m.Success, $"no anti-forgery field on {path}");
        return WebUtility.HtmlDecode(m.Groups[1].Value);
    }

    public static async Task SignInAsync(HttpClient client, string user)
    {
        var token = await TokenAsync(client, "/login");
        var r = await client.PostAsync("/login", new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["user"] = user, ["password"] = Password, ["returnUrl"] = "/", ["__RequestVerificationToken"] = token,
        }));
        Assert.Equal(HttpStatusCode.Redirect, r.StatusCode);
    }

    [GeneratedRegex("name=\"__RequestVerificationToken\" type=\"hidden\" value=\"([^\"]+)\"")]
    private static partial Regex TokenField();
}

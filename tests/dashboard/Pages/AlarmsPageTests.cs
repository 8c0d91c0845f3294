using System.Net;
using LoopWatch.Dashboard.Access;
using LoopWatch.Dashboard.Model;
using LoopWatch.Dashboard.Tests.Infrastructure;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class AlarmsPageTests
{
    [Fact]
    public async Task An_operator_acknowledges_and_shelves_a_stale_alarm_and_sees_it_in_the_journal()
    {
        await using var agent = await PageRig.StartWithStaleAlarmsAsync(PageRig.FastStale("FIC-980"));
        await PageRig.AddUserAsync(agent, "op.one", Roles.Operator);
        await using var chromium = await Chromium.LaunchAsync();
        var page = await chromium.NewPageAsync();

        // Not signed in: the alarm is listed, without forms.
        await page.GotoAsync(agent.Http.BaseAddress + "alarms");
        var row = page.Locator("tr[data-alarm='FIC-980:stale']");
        Assert.Equal(1, await row.CountAsync());
        Assert.Equal(0, await page.Locator("form.act").CountAsync());
        // Priority is a shape and a word, not colour alone (ISA-101): our default priority for stale is high.
        Assert.Equal("high", await row.Locator(".prio.prio-high").TextContentAsync());
        Assert.Contains("unacknowledged", await row.InnerTextAsync());

        await PageRig.SignInAsync(page, agent, "op.one", "/alarms");
        await row.Locator("form.ack input[name=comment]").FillAsync("transmitter gateway restarted");
        await row.Locator("form.ack button").ClickAsync();
        await page.Locator(".notice").WaitForAsync();
        Assert.Contains("FIC-980:stale acknowledged by op.one", await page.Locator(".notice").InnerTextAsync());
        Assert.Equal("acknowledged", await row.Locator(".state").TextContentAsync());

        // The journal is read from SQLite: wait for the writer, then the history shows the acknowledgement with user and comment.
        await PageRig.FlushAsync(agent);
        await page.ReloadAsync();
        var ackEntry = page.Locator("#history tr[data-to='acknowledged']");
        Assert.Equal(1, await ackEntry.CountAsync());
        var ackText = await ackEntry.InnerTextAsync();
        Assert.Contains("op.one", ackText);
        Assert.Contains("transmitter gateway restarted", ackText);
        Assert.Equal(1, await page.Locator("#history tr[data-to='unacknowledged']").CountAsync()); // the activation
        await Chromium.ShotAsync(page, "alarms-acknowledged");

        await row.Locator("form.shelve input[name=minutes]").FillAsync("30");
        await row.Locator("form.shelve input[name=comment]").FillAsync("transmitter replaced this shift");
        await row.Locator("form.shelve button").ClickAsync();
        await page.Locator(".notice", new() { HasText = "shelved for 30 min" }).WaitForAsync();
        Assert.Equal("shelved", await row.Locator(".state").TextContentAsync());
        var shelved = agent.App.Services.GetRequiredService<IAlarmView>().Alarms(false).Single(a => a.Id == "FIC-980:stale");
        Assert.Equal(("shelved", "op.one"), (shelved.State, shelved.ShelvedBy));

        // The history filter by new state shows only the shelving.
        await PageRig.FlushAsync(agent);
        await page.GotoAsync(agent.Http.BaseAddress + "alarms?loop=FIC-980&state=shelved");
        Assert.Equal(1, await page.Locator("#history tbody tr").CountAsync());
        Assert.Contains("transmitter replaced this shift", await page.Locator("#history tbody tr").InnerTextAsync());
        await Chromium.ShotAsync(page, "alarms-shelved");

        // The health figures: one activation in the last 24 h, within the EEMUA 191 benchmark of about 1 per 10 minutes.
        Assert.Contains("FIC-980", await page.Locator("#frequent").InnerTextAsync());
        Assert.Contains("acceptable", await page.Locator("#health").InnerTextAsync());

        // Sign out through the nav's POST form.
        await page.ClickAsync("form.signout button");
        await page.Locator(".who a", new() { HasText = "Sign in" }).WaitForAsync();
    }

    [Theory]
    [InlineData("Acknowledge")]
    [InlineData("Shelve")]
    public async Task A_change_is_refused_without_login_without_token_and_without_the_operator_role(string handler)
    {
        await using var agent = await PageRig.StartWithStaleAlarmsAsync(PageRig.FastStale("FIC-981"));
        await PageRig.AddUserAsync(agent, "op.two", Roles.Operator);
        await PageRig.AddUserAsync(agent, "view.one", Roles.Viewer);
        var alarms = agent.App.Services.GetRequiredService<IAlarmView>();
        var url = $"/alarms?handler={handler}";
        Dictionary<string, string> Form(string? token)
        {
            var f = new Dictionary<string, string> { ["id"] = "FIC-981:stale", ["minutes"] = "15", ["comment"] = "test" };
            if (token is not null) f["__RequestVerificationToken"] = token;
            return f;
        }

        // Not signed in, with a valid (anonymous) token: sent to the login form.
        using (var anonymous = PageRig.Client(agent))
        {
            var token = await PageRig.TokenAsync(anonymous, "/login");
            var r = await anonymous.PostAsync(url, new FormUrlEncodedContent(Form(token)));
            Assert.Equal(HttpStatusCode.Redirect, r.StatusCode);
            var to = r.Headers.Location!;
            Assert.StartsWith("/login", to.IsAbsoluteUri ? to.PathAndQuery : to.OriginalString);
            Assert.Equal(HttpStatusCode.BadRequest, (await anonymous.PostAsync(url, new FormUrlEncodedContent(Form(null)))).StatusCode);
        }

        // Signed in as a viewer with a token: 403.
        using (var viewer = PageRig.Client(agent))
        {
            await PageRig.SignInAsync(viewer, "view.one");
            var token = await PageRig.TokenAsync(viewer, "/login");
            Assert.Equal(HttpStatusCode.Forbidden, (await viewer.PostAsync(url, new FormUrlEncodedContent(Form(token)))).StatusCode);
        }

        // Signed in as an operator but without the token: 400 from anti-forgery validation; with it the change is taken.
        using var op = PageRig.Client(agent);
        await PageRig.SignInAsync(op, "op.two");
        Assert.Equal(HttpStatusCode.BadRequest, (await op.PostAsync(url, new FormUrlEncodedContent(Form(null)))).StatusCode);
        Assert.Equal("unacknowledged", alarms.Alarms(false).Single(a => a.Id == "FIC-981:stale").State); // nothing changed yet
        var ok = await op.PostAsync(url, new FormUrlEncodedContent(Form(await PageRig.TokenAsync(op, "/alarms"))));
        Assert.Equal(HttpStatusCode.Redirect, ok.StatusCode);
        var after = alarms.Alarms(false).Single(a => a.Id == "FIC-981:stale");
        Assert.Equal(handler == "Acknowledge" ? ("acknowledged", "op.two") : ("shelved", "op.two"),
            (after.State, handler == "Acknowledge" ? after.AckedBy : after.ShelvedBy));
    }
}

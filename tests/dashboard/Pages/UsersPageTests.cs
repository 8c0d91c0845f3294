using System.Net;
using LoopWatch.Agent.Tests.Infrastructure;
using LoopWatch.Dashboard.Access;
using LoopWatch.Storage.Users;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Dashboard.Tests.Pages;

public sealed class UsersPageTests
{
    [Fact]
    public async Task An_admin_adds_a_user_others_are_turned_away()
    {
        await using var agent = await RunningAgent.StartAsync([TestLoops.Pid("FIC-996")], embedded: true, brokerPort: FreePort.Next());
        await PageRig.AddUserAsync(agent, "ada", Roles.Admin);
        await PageRig.AddUserAsync(agent, "ria", Roles.Operator);

        using (var anonymous = PageRig.Client(agent))
        {
            var r = await anonymous.GetAsync("/users");
            Assert.Equal(HttpStatusCode.Redirect, r.StatusCode);
            Assert.Contains("/login", r.Headers.Location!.ToString());
        }
        using (var op = PageRig.Client(agent))
        {
            await PageRig.SignInAsync(op, "ria");
            var r = await op.GetAsync("/users");
            Assert.Equal(HttpStatusCode.Redirect, r.StatusCode); // signed in but not admin: sent to sign in as someone else
        }

        using var admin = PageRig.Client(agent);
        await PageRig.SignInAsync(admin, "ada");
        var form = new Dictionary<string, string> { ["name"] = "mo", ["role"] = Roles.Maintenance, ["password"] = "long enough pw" };
        Assert.Equal(HttpStatusCode.BadRequest, (await admin.PostAsync("/users?handler=Add", new FormUrlEncodedContent(form))).StatusCode);
        var token = await PageRig.TokenAsync(admin, "/users");
        var added = await admin.PostAsync("/users?handler=Add", new FormUrlEncodedContent(new Dictionary<string, string>(form) { ["__RequestVerificationToken"] = token }));
        Assert.Equal(HttpStatusCode.Redirect, added.StatusCode);
        var row = await agent.App.Services.GetRequiredService<UserStore>().FindAsync("mo");
        Assert.Equal(Roles.Maintenance, row!.Value.Role);
        Assert.True(Passwords.Verify("mo", row.Value.PasswordHash, "long enough pw"));
        Assert.Contains("data-user=\"mo\"", await admin.GetStringAsync("/users"));
    }
}

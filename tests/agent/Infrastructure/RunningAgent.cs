using System.Net.Http.Json;
using System.Text.Json;
using LoopWatch.Agent.Configuration;
using LoopWatch.Analytics.Configuration;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>The real agent host started in-process on free loopback ports, with an HTTP client on its dashboard.</summary>
public sealed class RunningAgent : IAsyncDisposable
{
    private RunningAgent(WebApplication app, AgentOptions options, HttpClient http, string dataDir)
    {
        App = app;
        Options = options;
        Http = http;
        DataDir = dataDir;
    }

    public WebApplication App { get; }
    public AgentOptions Options { get; }
    public HttpClient Http { get; }
    public string DataDir { get; }

    public static async Task<RunningAgent> StartAsync(IEnumerable<LoopOptions> loops, bool embedded, int brokerPort, TimeProvider? time = null, string? dataDir = null,
        Demo.DemoRun? demo = null, Action<AgentOptions>? tweak = null, Action<Microsoft.Extensions.DependencyInjection.IServiceCollection>? services = null,
        Action<Microsoft.Extensions.Logging.ILoggingBuilder>? logging = null)
    {
        var dir = dataDir ?? Directory.CreateTempSubdirectory("lw-agent-").FullName;
        var options = new AgentOptions
        {
            Broker = new BrokerOptions { Embedded = embedded, Host = "127.0.0.1", Port = brokerPort, ClientId = $"lw-test-{Guid.NewGuid():N}" },
            Dashboard = new DashboardOptions { Urls = "http://127.0.0.1:0" },
            DataDir = dir,
        };
        options.Loops.AddRange(loops);
        tweak?.Invoke(options);
        var errors = new List<string>();
        var specs = AgentOptionsCheck.Check(options, errors);
        if (errors.Count > 0) throw new InvalidOperationException(string.Join("; ", errors));
        var app = AgentHost.Build(new AgentSetup(options, specs, demo, time ?? TimeProvider.System), logging, services);
        await app.StartAsync();
        var http = new HttpClient { BaseAddress = new Uri(AgentHost.DashboardAddresses(app)[0]) };
        return new RunningAgent(app, options, http, dir);
    }

    /// <summary>Starts the agent as <c>loopwatch run --config FILE --data-dir DIR</c> does, watching the file for loop changes; its log lines go to <paramref name="logs"/>.</summary>
    public static async Task<RunningAgent> StartFromFileAsync(string configFile, string dataDir, LogCapture? logs = null)
    {
        var errors = new List<string>();
        var overrides = new Dictionary<string, string?> { ["LoopWatch:DataDir"] = dataDir };
        var options = AgentConfiguration.Load(configFile, overrides, errors, null, out var logging);
        var specs = errors.Count == 0 ? AgentOptionsCheck.Check(options, errors) : [];
        if (errors.Count > 0) throw new InvalidOperationException(string.Join("; ", errors));
        var setup = new AgentSetup(options, specs, null, TimeProvider.System) { Logging = logging, Source = new ConfigurationSource(configFile, overrides) };
        var app = AgentHost.Build(setup, logs is null ? null : b => b.AddProvider(logs));
        await app.StartAsync();
        var http = new HttpClient { BaseAddress = new Uri(AgentHost.DashboardAddresses(app)[0]) };
        return new RunningAgent(app, options, http, dataDir);
    }

    public async Task<JsonElement> LoopsAsync() => await Http.GetFromJsonAsync<JsonElement>("/api/loops");

    public async Task<JsonElement> HealthAsync() => await Http.GetFromJsonAsync<JsonElement>("/healthz");

    /// <summary>Waits until <c>/healthz</c> says the agent's subscription to the broker is up.</summary>
    public Task UntilSubscribedAsync(string what = "agent subscribed") =>
        Eventually.Until(async () => (await HealthAsync()).GetProperty("ingest").GetProperty("broker_connected").GetBoolean(), c => c, what: what);

    public async Task<JsonElement?> LoopAsync(string id)
    {
        foreach (var l in (await LoopsAsync()).EnumerateArray()) if (l.GetProperty("id").GetString() == id) return l;
        return null;
    }

    public async ValueTask DisposeAsync()
    {
        await App.StopAsync();
        await App.DisposeAsync();
        Http.Dispose();
    }
}

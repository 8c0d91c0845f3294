using Microsoft.Extensions.Configuration;
using LoopWatch.Agent.Alarms;
using LoopWatch.Agent.Broker;
using LoopWatch.Agent.Demo;
using LoopWatch.Agent.Ingest;
using LoopWatch.Agent.Plant;
using LoopWatch.Agent.Storage;
using LoopWatch.Storage;
using LoopWatch.Dashboard;
using LoopWatch.Dashboard.Model;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent;

/// <summary>Builds the agent: broker (when embedded), demo plant (for <c>demo</c>), MQTT ingest, storage and dashboard in one Generic Host.</summary>
public static class AgentHost
{
    /// <summary>Builds the web application without starting it.</summary>
    /// <remarks><paramref name="configure"/> runs after the agent's registrations, so it can replace them (tests use it for the action guard).</remarks>
    public static WebApplication Build(AgentSetup setup, Action<ILoggingBuilder>? logging = null, Action<IServiceCollection>? configure = null)
    {
        var builder = WebApplication.CreateBuilder(new WebApplicationOptions
        {
            Args = [],
            ContentRootPath = AppContext.BaseDirectory,
            EnvironmentName = "Production",
        });
        // The agent reads its own configuration (AgentConfiguration); the host gets none of the ASP.NET defaults (appsettings, ASPNETCORE_ vars).
        builder.Configuration.Sources.Clear();
        builder.Configuration.AddInMemoryCollection();
        builder.WebHost.UseUrls(setup.Options.Dashboard.Urls);
        Service.ServiceHosting.Configure(builder, setup.Logging);
        logging?.Invoke(builder.Logging);

        var services = builder.Services;
        var opts = setup.Options;
        // Agents of one plant share a broker, where the client id names the (persistent) session: one per shard.
        if (opts.Shard.Count > 1 && !opts.Broker.ClientId.EndsWith(ShardSuffix(opts.Shard), StringComparison.Ordinal))
            opts.Broker.ClientId += ShardSuffix(opts.Shard);
        services.AddSingleton(setup.Time);
        services.AddSingleton(opts);
        services.AddSingleton(opts.Broker);
        services.AddSingleton(new PlantClock(setup.Time, setup.Demo?.Speed ?? 1, opts.Broker.MaxLeadSeconds));
        services.AddSingleton(opts.AlarmSystem);
        services.AddSingleton(new StorageOptions
        {
            DatabasePath = Path.Combine(opts.DataDir, AgentStorage.FileName),
            RetentionDays = opts.AlarmSystem.RetentionDays,
        });
        services.AddSingleton<AgentStorage>();
        // Others (user store, reports) resolve the open database and reader; AgentStorage owns and closes them.
        services.AddSingleton(sp => sp.GetRequiredService<AgentStorage>().Database);
        services.AddSingleton(sp => sp.GetRequiredService<AgentStorage>().Reader);
        services.AddSingleton<IStorageHealth, WriterHealth>();
        services.AddSingleton<AlarmJournal>();
        services.AddSingleton(sp => new AlarmEngine(setup.Specs, [sp.GetRequiredService<AlarmJournal>()]));
        services.AddSingleton(sp =>
        {
            var storage = sp.GetRequiredService<AgentStorage>();
            var engine = sp.GetRequiredService<AlarmEngine>();
            LoopHooks hooks = (spec, statistics) =>
            [
                new HourlyRecorder(spec, statistics, row => storage.Writer.Post(row)),
                new AlarmFeed(engine.Loop(spec.Id)!, statistics),
            ];
            return new PlantState(setup.Specs, sp.GetRequiredService<PlantClock>(), setup.Time,
                sp.GetRequiredService<ILogger<PlantState>>(), FindingLog(sp.GetRequiredService<ILogger<PlantState>>()), hooks);
        });
        services.AddSingleton<IPlantView>(sp => sp.GetRequiredService<PlantState>());
        services.AddSingleton(opts.Sparkplug);
        services.AddSingleton<Sparkplug.SparkplugReader>();
        services.AddSingleton<IAlarmView, LiveAlarmView>();
        services.AddSingleton(opts.Valves);
        services.AddSingleton<Valves.ValveWear>();
        services.AddSingleton<IValveView>(sp => sp.GetRequiredService<Valves.ValveWear>());
        services.AddSingleton<IActionGuard, Dashboard.Access.RoleGuard>();

        // Hosted services start in registration order and stop in reverse: storage opens first and closes last,
        // stored alarm states are back before ingest, the broker runs before anyone connects to it.
        services.AddHostedService<StorageLifetime>();
        services.AddSingleton<Metrics.AgentMetrics>();
        services.AddHostedService(sp => sp.GetRequiredService<Metrics.AgentMetrics>());
        services.AddHostedService<AlarmRestore>();
        services.AddHostedService<Valves.ValveCounterSaver>();
        if (opts.Broker.Embedded)
        {
            services.AddSingleton<EmbeddedBroker>();
            services.AddHostedService(sp => sp.GetRequiredService<EmbeddedBroker>());
        }
        services.AddHostedService<MqttIngest>();
        if (opts.Sparkplug.RequestRebirth) services.AddHostedService<Sparkplug.SparkplugRebirth>();
        services.AddHostedService<PlantTicker>();
        if (setup.Source is { } source)
        {
            services.AddSingleton(source);
            services.AddSingleton(sp => ActivatorUtilities.CreateInstance<Reload.LoopReload>(sp, opts, setup.Specs));
            services.AddHostedService<Reload.ConfigurationWatcher>();
        }
        services.AddHostedService<AlarmTicker>();
        if (opts.AlarmSystem.PublishHealth) services.AddHostedService<HealthPublisher>();
        services.AddHostedService<RetentionService>();
        if (setup.Demo is { } demo)
        {
            services.AddSingleton(demo);
            services.AddSingleton(new DemoPlant());
            services.AddHostedService<PlantPublisher>();
        }
        var d = opts.Dashboard;
        // Other shards' loops are in the same configuration, so their areas are known for the merged weekly page.
        if (d.WeeklyDatabases.Count > 0)
            services.AddSingleton(new Dashboard.Reports.WeeklySources(d.WeeklyDatabases, opts.LoopAreas()));
        services.AddLoopWatchDashboard(new Dashboard.Access.DashboardAccess(d.RequireLoginToView), Path.Combine(Path.GetFullPath(opts.DataDir), "keys"),
            new Dashboard.Reports.ShiftSchedule(d.ShiftStartHour, d.ShiftHours, TimeZoneInfo.FindSystemTimeZoneById(d.TimeZone)));
        configure?.Invoke(services);

        var app = builder.Build();
        app.MapLoopWatchDashboard();
        Metrics.MetricsEndpoint.Map(app, opts.Dashboard.MetricsAccess);
        Sparkplug.SparkplugApi.Map(app);
        return app;
    }

    /// <summary>The addresses Kestrel actually listens on (useful when the configuration asked for port 0).</summary>
    public static IReadOnlyList<string> DashboardAddresses(WebApplication app) =>
        app.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()?.Addresses.ToList() ?? [];

    private static string ShardSuffix(Configuration.ShardOptions shard) => $"-shard-{shard.Index}-of-{shard.Count}";

    private static Action<Analytics.Findings.FindingChange> FindingLog(ILogger log) =>
        change =>
        {
            // Raised and ended are news for the log; updated figures arrive often and stay at debug level.
            if (change.Change == Analytics.Findings.FindingChangeKind.Updated) AgentLog.FindingUpdated(log, change.LoopId, change.Finding.Kind);
            else AgentLog.FindingChanged(log, change.LoopId, change.Change.ToString().ToLowerInvariant(), change.Finding.Kind);
        };
}

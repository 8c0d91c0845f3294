using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Hosting.Systemd;
using Microsoft.Extensions.Hosting.WindowsServices;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Console;

namespace LoopWatch.Agent.Service;

/// <summary>
/// Console logging and the service managers: simple single-line logs by default, JSON or systemd format through
/// <c>Logging:Console:FormatterName</c>; under systemd (Type=notify) the host reports READY/STOPPING, under the Windows
/// service control manager it runs as a service. Outside both nothing changes.
/// </summary>
public static class ServiceHosting
{
    /// <summary>Sets up console logging from <paramref name="logging"/> and registers the systemd and Windows service lifetimes.</summary>
    public static void Configure(WebApplicationBuilder builder, IConfiguration? logging)
    {
        builder.Logging.ClearProviders();
        builder.Logging.AddConsole();
        builder.Services.Configure<SimpleConsoleFormatterOptions>(o => { o.SingleLine = true; o.TimestampFormat = "HH:mm:ss "; });
        // Machine-read logs carry the full UTC time; one JSON object per line.
        builder.Services.Configure<JsonConsoleFormatterOptions>(o => { o.UseUtcTimestamp = true; o.TimestampFormat = "yyyy-MM-ddTHH:mm:ss.fffZ"; });
        builder.Logging.SetMinimumLevel(LogLevel.Information);
        builder.Logging.AddFilter("Microsoft.AspNetCore", LogLevel.Warning);
        if (logging is not null) builder.Logging.AddConfiguration(logging);

        // Each is a no-op unless the process was started by that service manager.
        builder.Services.AddSystemd();
        builder.Services.AddWindowsService();
        // AddSystemd picks the systemd format; a formatter named in the configuration still wins (JSON into the journal).
        if (FormatterName(logging) is { } name) builder.Services.Configure<ConsoleLoggerOptions>(o => o.FormatterName = name);
    }

    /// <summary>True when the console carries machine-read logs (JSON, systemd format, a service), so no human banner is printed there.</summary>
    public static bool MachineReadConsole(IConfiguration? logging) =>
        FormatterName(logging) is { } name && name != ConsoleFormatterNames.Simple
        || SystemdHelpers.IsSystemdService() || WindowsServiceHelpers.IsWindowsService();

    private static string? FormatterName(IConfiguration? logging) =>
        logging?["Console:FormatterName"] is { Length: > 0 } name ? name.Trim().ToLowerInvariant() : null;
}

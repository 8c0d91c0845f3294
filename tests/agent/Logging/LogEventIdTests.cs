using System.Reflection;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Tests.Logging;

/// <summary>
/// Event ids are what operators filter and alert on, so each must name one message across all assemblies, and each
/// family must keep to the range DEVELOPERS.md gives it (common practice, no source).
/// </summary>
public sealed class LogEventIdTests
{
    private static readonly Assembly[] Assemblies =
    [
        typeof(AgentLog).Assembly,
        typeof(LoopWatch.Storage.LoopWatchDatabase).Assembly,
        typeof(LoopWatch.Dashboard.DashboardSetup).Assembly,
        typeof(LoopWatch.Analytics.Windows.RingBuffer).Assembly,
    ];

    private static List<(int Id, string Method)> Declared() =>
        Assemblies.SelectMany(a => a.GetTypes())
            .SelectMany(t => t.GetMethods(BindingFlags.Static | BindingFlags.Instance | BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.DeclaredOnly))
            .Select(m => (Method: m, Attribute: m.GetCustomAttribute<LoggerMessageAttribute>()))
            .Where(x => x.Attribute is not null)
            .Select(x => (x.Attribute!.EventId, $"{x.Method.DeclaringType!.Name}.{x.Method.Name}"))
            .ToList();

    [Fact]
    public void Every_log_event_id_names_one_message()
    {
        var declared = Declared();
        Assert.True(declared.Count >= 40, $"only {declared.Count} log messages found");
        var doubled = declared.GroupBy(d => d.Id).Where(g => g.Count() > 1)
            .Select(g => $"{g.Key}: {string.Join(", ", g.Select(d => d.Method))}").ToList();
        Assert.True(doubled.Count == 0, "event ids used twice: " + string.Join("; ", doubled));
    }

    [Fact]
    public void Storage_log_events_are_in_the_5xxx_range()
    {
        var storage = Declared().Where(d => d.Method.StartsWith("StorageWriterLog.", StringComparison.Ordinal)
            || d.Method.StartsWith("MigrationRunner.", StringComparison.Ordinal) || d.Method.StartsWith("StorageLog.", StringComparison.Ordinal)).ToList();
        Assert.True(storage.Count >= 12, $"only {storage.Count} storage log messages found");
        Assert.All(storage, d => Assert.InRange(d.Id, 5000, 5999));
    }
}

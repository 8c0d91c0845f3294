using System.Globalization;
using LoopWatch.Agent.Configuration;
using LoopWatch.Dashboard.Reports;
using LoopWatch.Storage;
using LoopWatch.Storage.Reading;

namespace LoopWatch.Agent.Report;

/// <summary>
/// <c>loopwatch report weekly --db FILE [--db FILE...] [--week DATE] [--config FILE] [--format text|csv]</c>: the
/// plant-wide weekly figures merged from the databases of several agents (one per shard), computed exactly as the
/// dashboard's weekly page. Exit 0 written, 1 a database could not be read, 2 usage error.
/// </summary>
public static class ReportCommand
{
    /// <summary>The usage line of the verb.</summary>
    public const string Usage = "loopwatch report weekly --db FILE [--db FILE...] [--week YYYY-MM-DD] [--config FILE] [--format text|csv]";

    /// <summary>Runs the verb on its arguments (after the word <c>report</c>).</summary>
    public static async Task<int> RunAsync(IEnumerable<string> args, TextWriter stdout, TextWriter stderr, TimeProvider time, CancellationToken ct)
    {
        var errors = new List<string>();
        var cli = CliArguments.Parse(args, new HashSet<string>(), errors);
        if (cli.Operands is not ["weekly"]) errors.Add("the only report is 'weekly'");
        var dbs = cli.All("db");
        if (dbs.Count == 0) errors.Add("--db: at least one database file is required");
        foreach (var db in dbs) if (!File.Exists(db)) errors.Add($"--db: file '{db}' not found");
        var format = cli.Get("format") ?? "text";
        if (format is not ("text" or "csv")) errors.Add($"--format: '{format}' is not one of text, csv");
        var weekText = cli.Get("week");
        DateOnly? day = null;
        if (weekText is not null)
        {
            if (DateOnly.TryParseExact(weekText, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var d)) day = d;
            else errors.Add($"--week: '{weekText}' is not a date yyyy-MM-dd");
        }
        var configFile = cli.Get("config");
        foreach (var unused in cli.Unused()) errors.Add($"--{unused}: unknown option for 'report'");

        // Areas and the plant's time zone come from the configuration when given; loops are then listed in its order.
        var options = configFile is not null && errors.Count == 0 ? AgentConfiguration.Load(configFile, new Dictionary<string, string?>(), errors) : new AgentOptions();
        if (configFile is not null && errors.Count == 0) AgentOptionsCheck.Check(options, errors);
        if (errors.Count > 0)
        {
            foreach (var e in errors) stderr.WriteLine($"loopwatch report: {e}");
            stderr.WriteLine($"usage: {Usage}");
            return 2;
        }
        var zone = TimeZoneInfo.FindSystemTimeZoneById(options.Dashboard.TimeZone);
        var week = day is { } w ? ReportWeek.Containing(w, zone) : ReportWeek.LastComplete(time.GetUtcNow(), zone);
        var areas = options.LoopAreas();

        var databases = new List<LoopWatchDatabase>();
        try
        {
            // Read-only: a report never creates, migrates or writes the agents' files, which may be in use.
            foreach (var db in dbs) databases.Add(LoopWatchDatabase.OpenReadOnly(db));
            var summary = await WeeklyRead.SummaryAsync(databases.Select(d => new StorageReader(d)), week, areas, ct);
            if (format == "csv") stdout.Write(WeeklyCsv.Write(summary));
            else WeeklyText.Write(summary, dbs.Count, stdout);
            return 0;
        }
        catch (Exception e) when (e is Microsoft.Data.Sqlite.SqliteException or IOException or LoopWatch.Storage.Schema.StorageSchemaException)
        {
            stderr.WriteLine($"loopwatch report: could not read: {e.Message}");
            return 1;
        }
        finally
        {
            foreach (var d in databases) d.Dispose();
        }
    }
}

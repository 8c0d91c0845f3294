using LoopWatch.Agent.Configuration;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// <c>loopwatch analyze --config loops.json [--format text|json|csv|html] [--out FILE] [--from T] [--to T] [--strict] FILE...</c>:
/// historian CSV exports through the live analytics path. Exit 0 when anything was analysed, 1 when nothing could be
/// (or, with <c>--strict</c>, when any row was bad), 2 for usage or configuration errors.
/// </summary>
public static class AnalyzeCommand
{
    /// <summary>The usage line of the verb.</summary>
    public const string Usage = "loopwatch analyze --config FILE [--format text|json|csv|html] [--out FILE] [--from T] [--to T] [--strict] FILE...";

    /// <summary>Runs the verb on its arguments (after the word <c>analyze</c>).</summary>
    public static int Run(IEnumerable<string> args, TextWriter stdout, TextWriter stderr)
    {
        var errors = new List<string>();
        var cli = CliArguments.Parse(args, new HashSet<string> { "strict" }, errors);
        var configFile = cli.Get("config");
        if (configFile is null) errors.Add("--config: is required");
        var formatText = cli.Get("format") ?? "text";
        if (!Enum.TryParse<ReportFormat>(formatText, ignoreCase: true, out var format) || !Enum.IsDefined(format) || char.IsDigit(formatText[0]))
            errors.Add($"--format: '{formatText}' is not one of text, json, csv, html");
        var outFile = cli.Get("out");
        var from = Time(cli.Get("from"), "from", errors) ?? long.MinValue;
        var to = Time(cli.Get("to"), "to", errors) ?? long.MaxValue;
        if (from != long.MinValue && to != long.MaxValue && to <= from) errors.Add("--to: must be later than --from");
        var strict = cli.Flag("strict");
        foreach (var unused in cli.Unused()) errors.Add($"--{unused}: unknown option for 'analyze'");
        if (cli.Operands.Count == 0) errors.Add("no input file given");
        foreach (var f in cli.Operands) if (!File.Exists(f)) errors.Add($"{f}: file not found");

        var options = errors.Count == 0 ? AgentConfiguration.Load(configFile, new Dictionary<string, string?>(), errors) : new AgentOptions();
        var specs = errors.Count == 0 ? AgentOptionsCheck.Check(options, errors) : [];
        if (errors.Count > 0)
        {
            foreach (var e in errors) stderr.WriteLine($"loopwatch analyze: {e}");
            stderr.WriteLine($"usage: {Usage}");
            return 2;
        }

        // A progress bar only for a person watching a terminal; redirected stderr (scripts, CI) stays clean.
        var bar = !Console.IsErrorRedirected && ReferenceEquals(stderr, Console.Error) ? new ProgressBar(stderr) : null;
        var analysis = new OfflineAnalysis(specs) { FromTicks = from, ToTicks = to, Progress = bar is null ? null : bar.Show };
        var result = analysis.Run(cli.Operands);

        if (outFile is null) WriteReport(result, format, stdout);
        else
        {
            using var file = new StreamWriter(outFile, append: false, new System.Text.UTF8Encoding(false));
            WriteReport(result, format, file);
        }

        var r = result.Rejects;
        if (r.Rows > 0) stderr.WriteLine($"loopwatch analyze: {r.Rows} row(s) could not be read" + (r.Examples.Count > 0 ? $", first at {r.Examples[0].File}:{r.Examples[0].Line}: {r.Examples[0].Reason}" : ""));
        if (r.UnknownTagCount > 0) stderr.WriteLine($"loopwatch analyze: {r.UnknownTagCount} unknown tag(s), {r.UnknownValues} value(s) ignored");
        foreach (var e in r.FileErrors) stderr.WriteLine($"loopwatch analyze: {e}");
        if (!result.AnythingAnalysed)
        {
            stderr.WriteLine("loopwatch analyze: nothing could be analysed");
            return 1;
        }
        if (strict && (r.Rows > 0 || r.FileErrors.Count > 0))
        {
            stderr.WriteLine("loopwatch analyze: --strict: bad input");
            return 1;
        }
        return 0;
    }

    private static void WriteReport(AnalysisResult result, ReportFormat format, TextWriter o)
    {
        switch (format)
        {
            case ReportFormat.Json:
                o.Flush();
                using (var buffer = new MemoryStream())
                {
                    JsonReport.Write(result, buffer);
                    o.Write(System.Text.Encoding.UTF8.GetString(buffer.GetBuffer(), 0, (int)buffer.Length));
                }
                o.WriteLine();
                break;
            case ReportFormat.Csv: CsvReport.Write(result, o); break;
            case ReportFormat.Html: HtmlReport.Write(result, o); break;
            default: TextReport.Write(result, o); break;
        }
        o.Flush();
    }

    private static long? Time(string? text, string name, List<string> errors)
    {
        if (text is null) return null;
        if (new ZonedTimestamp().TryParse(text, out var ticks)) return ticks;
        errors.Add($"--{name}: '{text}' is not an ISO 8601 time with Z or an offset");
        return null;
    }
}

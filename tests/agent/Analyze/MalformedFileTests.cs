using System.Globalization;
using System.Text;
using System.Text.Json;
using LoopWatch.Agent.Tests.Infrastructure;

namespace LoopWatch.Agent.Tests.Analyze;

/// <summary>Bad input: counted with file and line, never fatal; exit codes 0 analysed, 1 nothing (or --strict), 2 usage.</summary>
public sealed class MalformedFileTests : IDisposable
{
    private readonly AnalyzeRun _run = new();
    private readonly string _config;

    public MalformedFileTests() => _config = _run.File("loops.json", PlantRecording.ConfigFor([TestLoops.Pid("FIC-1", "t")]));

    public void Dispose() => _run.Dispose();

    /// <summary>Ten minutes of FIC-1 at 1 s, long format; line 1 is the header, so second s is on lines 2 + 3s .. 4 + 3s.</summary>
    private static List<string> Lines(int seconds = 600)
    {
        var lines = new List<string> { "timestamp,tag,value" };
        for (var s = 0; s < seconds; s++)
        {
            var at = PlantRecording.Stamp(PlantRecording.Start.AddSeconds(s));
            var pv = 100 + 5 * Math.Sin(s / 20.0);
            lines.Add(string.Create(CultureInfo.InvariantCulture, $"{at},t/FIC-1/pv,{pv:0.###}"));
            lines.Add($"{at},t/FIC-1/sp,100");
            lines.Add(string.Create(CultureInfo.InvariantCulture, $"{at},t/FIC-1/op,{50 + (s % 7):0}"));
        }
        return lines;
    }

    private string Write(string name, IEnumerable<string> lines, bool finalNewline = true) =>
        _run.File(name, string.Join('\n', lines) + (finalNewline ? "\n" : ""));

    private async Task<(int Exit, JsonElement Report, string Err)> Analyze(params string[] args)
    {
        var (exit, stdout, stderr) = await _run.Cli(["--config", _config, "--format", "json", .. args]);
        return (exit, stdout.Length > 0 ? JsonDocument.Parse(stdout).RootElement : default, stderr);
    }

    private static JsonElement Rejected(JsonElement report) => report.GetProperty("rejected");

    [Fact]
    public async Task A_truncated_last_line_is_one_bad_row_with_its_line_number_and_the_rest_is_analysed()
    {
        var lines = Lines();
        lines.Add("2026-03-02T06:10:00.000Z,t/FIC-1/p");
        var (exit, report, _) = await Analyze(Write("cut.csv", lines, finalNewline: false));
        Assert.Equal(0, exit);
        Assert.Equal(1, Rejected(report).GetProperty("rows").GetInt64());
        var example = Rejected(report).GetProperty("examples")[0];
        Assert.Equal(lines.Count, example.GetProperty("line").GetInt32());
        Assert.Contains("column count", example.GetProperty("reason").GetString());
        Assert.Equal(600, AnalyzeRun.Loop(report, "FIC-1").GetProperty("samples").GetInt64());
    }

    [Fact]
    public async Task Wrong_column_counts_non_numbers_and_zoneless_times_are_counted_and_strict_turns_them_into_exit_1()
    {
        var lines = Lines();
        lines[10] = "2026-03-02T06:00:03.000Z,t/FIC-1/pv,100,good,extra";
        lines[20] = "2026-03-02T06:00:06.000Z,t/FIC-1/pv,abc";
        lines[30] = "2026-03-02T06:00:09.000,t/FIC-1/pv,100";
        var file = Write("bad.csv", lines);
        var (exit, report, err) = await Analyze(file);
        Assert.Equal(0, exit);
        var examples = Rejected(report).GetProperty("examples").EnumerateArray().ToList();
        Assert.Equal(3, Rejected(report).GetProperty("rows").GetInt64());
        Assert.Equal([11, 21, 31], examples.Select(e => e.GetProperty("line").GetInt32()));
        Assert.Contains("column count", examples[0].GetProperty("reason").GetString());
        Assert.Contains("NotANumber", examples[1].GetProperty("reason").GetString());
        Assert.Contains("timestamp", examples[2].GetProperty("reason").GetString());
        Assert.Contains("bad.csv:11", err);

        var strict = await Analyze("--strict", file);
        Assert.Equal(1, strict.Exit);
    }

    [Fact]
    public async Task Rows_out_of_time_order_are_counted_and_dropped_by_the_monitor_and_duplicates_change_nothing()
    {
        var clean = await Analyze(Write("clean.csv", Lines()));
        var lines = Lines();
        // A row from second 5 placed after second 300: out of order in the file, and older than the loop's current interval.
        lines.Insert(3 * 300 + 4, lines[3 * 5 + 1]);
        var (exit, late, _) = await Analyze(Write("late.csv", lines));
        Assert.Equal(0, exit);
        Assert.Equal(1, Rejected(late).GetProperty("out_of_order").GetInt64());
        Assert.Equal(1, Rejected(late).GetProperty("late").GetInt64());
        Assert.Equal(AnalyzeRun.Loop(clean.Report, "FIC-1").GetProperty("stats").GetRawText(), AnalyzeRun.Loop(late, "FIC-1").GetProperty("stats").GetRawText());

        var doubled = Lines().SelectMany((l, i) => i == 0 ? [l] : new[] { l, l });
        var dup = await Analyze(Write("dup.csv", doubled));
        Assert.Equal(0, dup.Exit);
        Assert.Equal(0, Rejected(dup.Report).GetProperty("rows").GetInt64());
        Assert.Equal(AnalyzeRun.Loop(clean.Report, "FIC-1").GetProperty("stats").GetRawText(), AnalyzeRun.Loop(dup.Report, "FIC-1").GetProperty("stats").GetRawText());
        Assert.Equal(AnalyzeRun.Loop(clean.Report, "FIC-1").GetProperty("findings").GetRawText(), AnalyzeRun.Loop(dup.Report, "FIC-1").GetProperty("findings").GetRawText());
    }

    [Fact]
    public async Task An_empty_file_or_a_header_alone_analyses_nothing_and_exits_1()
    {
        var empty = await Analyze(_run.File("empty.csv", ""));
        Assert.Equal(1, empty.Exit);
        Assert.Contains("empty", Rejected(empty.Report).GetProperty("files")[0].GetString());
        var header = await Analyze(_run.File("header.csv", "timestamp,tag,value\n"));
        Assert.Equal(1, header.Exit);
        Assert.Equal(0, Rejected(header.Report).GetProperty("rows").GetInt64());
        Assert.Contains("nothing could be analysed", header.Err);
    }

    [Fact]
    public async Task A_named_pipe_is_read_like_a_file()
    {
        // A shell's `<(zcat export.csv.gz)` hands the program a pipe that cannot seek: common practice, no source.
        var file = Write("plain.csv", Lines());
        var fifo = _run.PathOf("pipe.csv");
        using (var mk = System.Diagnostics.Process.Start("mkfifo", [fifo])) mk.WaitForExit();
        Assert.True(System.IO.File.Exists(fifo), "mkfifo made no pipe");
        var writer = Task.Run(() => System.IO.File.WriteAllText(fifo, System.IO.File.ReadAllText(file)));
        var piped = await Analyze(fifo);
        await writer;
        var plain = await Analyze(file);
        Assert.Equal(0, piped.Exit);
        Assert.Equal(AnalyzeRun.Loop(plain.Report, "FIC-1").GetProperty("samples").GetInt64(), AnalyzeRun.Loop(piped.Report, "FIC-1").GetProperty("samples").GetInt64());
        Assert.Equal(AnalyzeRun.Loop(plain.Report, "FIC-1").GetProperty("stats").GetRawText(), AnalyzeRun.Loop(piped.Report, "FIC-1").GetProperty("stats").GetRawText());
    }

    [Fact]
    public async Task Unknown_tags_are_counted_and_listed()
    {
        var lines = Lines();
        lines.Add("2026-03-02T06:10:00.000Z,t/FIC-9/pv,1");
        lines.Add("2026-03-02T06:10:00.000Z,t/FIC-9/pv,2");
        lines.Add("2026-03-02T06:10:00.000Z,t/XY-1/op,3");
        var (exit, report, _) = await Analyze(Write("unknown.csv", lines));
        Assert.Equal(0, exit);
        var unknown = Rejected(report).GetProperty("unknown_tags");
        Assert.Equal(3, unknown.GetProperty("values").GetInt64());
        Assert.Equal(2, unknown.GetProperty("count").GetInt64());
        var tags = unknown.GetProperty("tags").EnumerateArray().ToDictionary(t => t.GetProperty("tag").GetString()!, t => t.GetProperty("values").GetInt64());
        Assert.Equal(new Dictionary<string, long> { ["t/FIC-9/pv"] = 2, ["t/XY-1/op"] = 1 }, tags);
    }

    [Fact]
    public async Task Files_in_any_order_split_by_time_or_by_tag_merge_into_the_same_analysis()
    {
        var lines = Lines();
        var whole = await Analyze(Write("whole.csv", lines));
        var header = lines[0];
        var body = lines.Skip(1).ToList();
        var early = Write("early.csv", body.Take(900).Prepend(header));
        var later = Write("later.csv", body.Skip(900).Prepend(header));
        var byTime = await Analyze(later, early);
        var pv = Write("pv.csv", body.Where(l => l.Contains("/pv,")).Prepend(header));
        var rest = Write("rest.csv", body.Where(l => !l.Contains("/pv,")).Prepend(header));
        var byTag = await Analyze(pv, rest);
        var expected = AnalyzeRun.Loop(whole.Report, "FIC-1").GetProperty("stats").GetRawText();
        Assert.Equal(expected, AnalyzeRun.Loop(byTime.Report, "FIC-1").GetProperty("stats").GetRawText());
        Assert.Equal(expected, AnalyzeRun.Loop(byTag.Report, "FIC-1").GetProperty("stats").GetRawText());
        Assert.Equal(0, Rejected(byTime.Report).GetProperty("out_of_order").GetInt64());
    }

    [Fact]
    public async Task A_wide_row_with_a_bad_cell_is_rejected_whole()
    {
        var csv = new StringBuilder("timestamp,t/FIC-1/pv,t/FIC-1/sp,t/FIC-1/op,t/FIC-1/mode\n");
        for (var s = 0; s < 120; s++)
            csv.Append(PlantRecording.Stamp(PlantRecording.Start.AddSeconds(s))).Append(s == 50 ? ",100,100,fifty,auto\n" : ",100,100,50,auto\n");
        var (exit, report, _) = await Analyze(_run.File("wide.csv", csv.ToString()));
        Assert.Equal(0, exit);
        Assert.Equal(1, Rejected(report).GetProperty("rows").GetInt64());
        Assert.Equal(52, Rejected(report).GetProperty("examples")[0].GetProperty("line").GetInt32());
        Assert.Equal(120, AnalyzeRun.Loop(report, "FIC-1").GetProperty("samples").GetInt64()); // the held values fill the rejected second
    }

    [Theory]
    [InlineData("--format", "xml")]
    [InlineData("--from", "2026-03-02T06:00:00")]
    [InlineData("--bogus", "1")]
    public async Task Usage_errors_exit_2(string option, string value)
    {
        var (exit, _, err) = await Analyze(option, value, Write("ok.csv", Lines(10)));
        Assert.Equal(2, exit);
        Assert.Contains(option, err);
    }

    [Fact]
    public async Task A_missing_config_a_bad_config_or_no_file_exit_2()
    {
        Assert.Equal(2, (await _run.Cli(Write("a.csv", Lines(10)))).Exit);
        var bad = _run.File("bad.json", """{ "LoopWatch": { "Loops": [ { "Id": "X", "Kind": "pid", "Process": "flow", "Pv": { "Tag": "a", "Min": 5, "Max": 1 }, "Op": { "Tag": "b" } } ] } }""");
        var (exit, _, err) = await _run.Cli("--config", bad, Write("b.csv", Lines(10)));
        Assert.Equal(2, exit);
        Assert.Contains("X", err);
        Assert.Equal(2, (await _run.Cli("--config", _config)).Exit);
        Assert.Equal(2, (await _run.Cli("--config", _config, _run.PathOf("missing.csv"))).Exit);
    }
}

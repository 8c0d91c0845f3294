using System.Text.RegularExpressions;

namespace LoopWatch.Storage.Tests.Writing;

/// <summary>
/// Reads the project's sources: every statement handed to Dapper is a constant with <c>@Parameters</c>, so no text from
/// a loop id, tag, user or comment can ever become SQL.
/// </summary>
public sealed partial class SqlSourceTests
{
    // The SQL argument of a Dapper call: Execute/Query..., directly or through a CommandDefinition.
    [GeneratedRegex(@"\.(?:Execute|ExecuteAsync|ExecuteScalar|ExecuteScalarAsync|Query|QueryAsync|QueryFirst\w*|QuerySingle\w*)(?:<[^>(]+>)?\(\s*(?:new CommandDefinition\(\s*)?(?<arg>\$?""{1,3}|[A-Za-z_][\w.]*!?)")]
    private static partial Regex DapperCall();

    [GeneratedRegex(@"const string (?<name>\w+)\s*=")]
    private static partial Regex ConstString();

    [GeneratedRegex(@"\$@?""{1,3}[^""]*?\b(?:SELECT|INSERT|UPDATE|DELETE|DROP|PRAGMA|CREATE|ALTER)\b", RegexOptions.IgnoreCase)]
    private static partial Regex InterpolatedSql();

    // Statement variables that carry a constant from elsewhere, each checked by eye: the writer's commands hold the
    // WriteSql constants they were queued with, migrations are constants, and the pragma line holds only a number.
    private static readonly HashSet<string> VettedVariables = ["sql", "command.Sql!", "migration.Sql", "_connectionPragmas"];

    [Fact]
    public void Every_dapper_call_gets_a_constant_statement_and_no_sql_is_built_by_interpolation()
    {
        var root = RepositoryRoot();
        var files = new[] { "storage", "agent", "dashboard" }
            .SelectMany(d => Directory.EnumerateFiles(Path.Combine(root, d), "*.cs", SearchOption.AllDirectories))
            .Where(f => !f.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal)
                && !f.Contains($"{Path.DirectorySeparatorChar}bin{Path.DirectorySeparatorChar}", StringComparison.Ordinal))
            .ToDictionary(f => Path.GetRelativePath(root, f), File.ReadAllText);
        var constants = files.Values.SelectMany(t => ConstString().Matches(t)).Select(m => m.Groups["name"].Value).ToHashSet();

        var calls = 0;
        var problems = new List<string>();
        foreach (var (file, text) in files)
        {
            foreach (Match m in DapperCall().Matches(text))
            {
                calls++;
                var arg = m.Groups["arg"].Value;
                var constant = arg.StartsWith('"') || constants.Contains(arg.Split('.')[^1]) || VettedVariables.Contains(arg);
                if (!constant) problems.Add($"{file}: SQL from '{arg}'");
            }
            foreach (Match m in InterpolatedSql().Matches(text)) problems.Add($"{file}: interpolated SQL '{m.Value}'");
        }
        Assert.True(calls >= 15, $"only {calls} Dapper calls found: is the pattern still right?");
        Assert.True(problems.Count == 0, string.Join("\n", problems));
    }

    [Fact]
    public void The_check_catches_an_interpolated_statement()
    {
        // The pattern itself must see what it is meant to forbid.
        Assert.Matches(InterpolatedSql(), "connection.Execute($\"DELETE FROM users WHERE name = '{name}'\")");
        var m = DapperCall().Match("connection.Query<UserRow>(text, new { Name = name })");
        Assert.Equal("text", m.Groups["arg"].Value);
    }

    private static string RepositoryRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "LoopWatch.sln"))) dir = dir.Parent;
        return dir?.FullName ?? throw new InvalidOperationException("LoopWatch.sln not found above the test folder");
    }
}

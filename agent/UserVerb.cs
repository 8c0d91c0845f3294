using LoopWatch.Agent.Storage;
using LoopWatch.Dashboard.Access;
using LoopWatch.Storage;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Users;

namespace LoopWatch.Agent;

/// <summary><c>loopwatch user add NAME --role ROLE [--data-dir DIR]</c>: creates a dashboard user, asking for the password.</summary>
public static class UserVerb
{
    /// <summary>Runs the verb; the password is read from the terminal without echo, or as one line from redirected input.</summary>
    public static async Task<int> RunAsync(CliArguments cli, List<string> errors, TextReader stdin, TextWriter stdout, TextWriter stderr)
    {
        var role = cli.Get("role")?.Trim().ToLowerInvariant();
        var dataDir = cli.Get("data-dir") ?? "data";
        foreach (var unused in cli.Unused()) errors.Add($"--{unused}: unknown option for 'user'");
        if (cli.Operands is not ["add", var name]) { errors.Add("usage: loopwatch user add NAME --role ROLE [--data-dir DIR]"); name = ""; }
        else if (string.IsNullOrWhiteSpace(name) || name.Length > 64 || name.Any(char.IsControl)) errors.Add("NAME: 1-64 printable characters");
        if (role is null) errors.Add("--role: is required (" + string.Join(", ", Roles.All) + ")");
        else if (!Roles.All.Contains(role)) errors.Add($"--role: '{role}' is not one of {string.Join(", ", Roles.All)}");
        if (errors.Count > 0)
        {
            foreach (var e in errors) stderr.WriteLine($"loopwatch: {e}");
            return 2;
        }

        var password = ReadPassword(stdin, stdout, Console.IsInputRedirected);
        if (password is null || password.Length < 8)
        {
            stderr.WriteLine("loopwatch: the password must have at least 8 characters");
            return 2;
        }
        bool added;
        try
        {
            using var db = LoopWatchDatabase.Open(new StorageOptions { DatabasePath = Path.Combine(dataDir, AgentStorage.FileName) });
            added = await new UserStore(db).AddAsync(new UserRow(name, role!, Passwords.Hash(name, password), TimeProvider.System.GetUtcNow().ToUnixTimeMilliseconds()));
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or Microsoft.Data.Sqlite.SqliteException)
        {
            // A read-only, locked or missing database is the operator's to fix; say so instead of a stack trace.
            stderr.WriteLine($"loopwatch: could not add user '{name}': {e.Message}");
            return 1;
        }
        if (!added)
        {
            stderr.WriteLine($"loopwatch: user '{name}' exists already");
            return 1;
        }
        stdout.WriteLine($"user '{name}' added with role {role}");
        return 0;
    }

    private static string? ReadPassword(TextReader stdin, TextWriter stdout, bool redirected)
    {
        if (redirected || !ReferenceEquals(stdin, Console.In)) return stdin.ReadLine();
        stdout.Write("password: ");
        var chars = new System.Text.StringBuilder();
        while (true)
        {
            var key = Console.ReadKey(intercept: true);
            if (key.Key == ConsoleKey.Enter) break;
            if (key.Key == ConsoleKey.Backspace) { if (chars.Length > 0) chars.Length--; continue; }
            chars.Append(key.KeyChar);
        }
        stdout.WriteLine();
        return chars.ToString();
    }
}

namespace LoopWatch.Agent;

/// <summary>A verb's arguments: <c>--name value</c> options, <c>--flag</c> switches and plain operands.</summary>
public sealed class CliArguments
{
    private readonly Dictionary<string, List<string>> _options = new(StringComparer.Ordinal);
    private readonly HashSet<string> _used = new(StringComparer.Ordinal);

    /// <summary>Operands (file names) in order.</summary>
    public List<string> Operands { get; } = [];

    /// <summary>Parses; options listed in <paramref name="flags"/> take no value.</summary>
    public static CliArguments Parse(IEnumerable<string> args, IReadOnlySet<string> flags, List<string> errors)
    {
        var result = new CliArguments();
        using var e = args.GetEnumerator();
        while (e.MoveNext())
        {
            var a = e.Current;
            if (!a.StartsWith("--", StringComparison.Ordinal) || a.Length == 2) { result.Operands.Add(a); continue; }
            var name = a[2..];
            string value;
            var eq = name.IndexOf('=');
            if (eq > 0) { value = name[(eq + 1)..]; name = name[..eq]; }
            else if (flags.Contains(name)) value = "true";
            else if (e.MoveNext()) value = e.Current;
            else { errors.Add($"--{name}: needs a value"); break; }
            if (!result._options.TryGetValue(name, out var list)) result._options[name] = list = [];
            list.Add(value);
        }
        return result;
    }

    /// <summary>The last value given for an option, or null.</summary>
    public string? Get(string name)
    {
        _used.Add(name);
        return _options.TryGetValue(name, out var v) ? v[^1] : null;
    }

    /// <summary>Every value given for a repeatable option.</summary>
    public IReadOnlyList<string> All(string name)
    {
        _used.Add(name);
        return _options.TryGetValue(name, out var v) ? v : [];
    }

    /// <summary>True when a switch was given.</summary>
    public bool Flag(string name) => Get(name) is "true" or "1" or "yes";

    /// <summary>A positive number option, or the default; problems go to <paramref name="errors"/>.</summary>
    public double Number(string name, double fallback, List<string> errors)
    {
        var text = Get(name);
        if (text is null) return fallback;
        if (double.TryParse(text, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var v) && v > 0 && double.IsFinite(v)) return v;
        errors.Add($"--{name}: '{text}' is not a positive number");
        return fallback;
    }

    /// <summary>Options given that no code asked for.</summary>
    public IEnumerable<string> Unused() => _options.Keys.Where(k => !_used.Contains(k));
}

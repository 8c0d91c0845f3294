using Microsoft.Extensions.Configuration;

namespace LoopWatch.Agent.Configuration;

/// <summary>Loads <see cref="AgentOptions"/> from a JSON file, then environment variables (<c>LOOPWATCH__...</c>), then command-line overrides.</summary>
public static class AgentConfiguration
{
    /// <summary>The configuration section every key lives under.</summary>
    public const string Section = "LoopWatch";

    /// <summary>Reads and binds; binding problems (wrong types, unknown keys) are added to <paramref name="errors"/>.</summary>
    public static AgentOptions Load(string? file, IDictionary<string, string?> overrides, List<string> errors, AgentOptions? seed = null) =>
        Load(file, overrides, errors, seed, out _);

    /// <summary>As <see cref="Load(string?, IDictionary{string, string?}, List{string}, AgentOptions?)"/>, also giving the top-level
    /// <c>Logging</c> section (standard .NET logging keys such as <c>Logging:Console:FormatterName</c>).</summary>
    public static AgentOptions Load(string? file, IDictionary<string, string?> overrides, List<string> errors, AgentOptions? seed, out IConfiguration logging)
    {
        logging = new ConfigurationBuilder().Build();
        var builder = new ConfigurationBuilder();
        if (file is not null)
        {
            if (!File.Exists(file)) { errors.Add($"--config: file '{file}' not found"); return seed ?? new AgentOptions(); }
            builder.AddJsonFile(Path.GetFullPath(file), optional: false, reloadOnChange: false);
        }
        // Unprefixed, because LOOPWATCH__BROKER__PORT must land on LoopWatch:Broker:Port (keys are case-insensitive).
        builder.AddEnvironmentVariables();
        builder.AddInMemoryCollection(overrides);
        var options = seed ?? new AgentOptions();
        IConfigurationRoot root;
        try
        {
            root = builder.Build();
        }
        catch (Exception e) when (e is FormatException or InvalidDataException or IOException)
        {
            errors.Add($"--config: {file} is not valid JSON: {e.Message}");
            return options;
        }
        logging = root.GetSection("Logging");
        try
        {
            root.GetSection(Section).Bind(options, o => o.ErrorOnUnknownConfiguration = true);
        }
        catch (InvalidOperationException e)
        {
            errors.Add(Describe(e));
        }
        return options;
    }

    private static string Describe(InvalidOperationException e)
    {
        // The binder names the full path ("LoopWatch:Loops:0:Pv:Min"); keep its words but drop our section prefix.
        var message = e.InnerException is null ? e.Message : $"{e.Message} {e.InnerException.Message}";
        return message.Replace($"'{Section}:", "'", StringComparison.OrdinalIgnoreCase);
    }
}

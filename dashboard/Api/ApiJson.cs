using System.Text.Json;
using System.Text.Json.Serialization;

namespace LoopWatch.Dashboard.Api;

/// <summary>JSON settings of every API answer: snake_case names, nulls kept, ISO 8601 times.</summary>
public static class ApiJson
{
    /// <summary>The shared serializer options.</summary>
    public static JsonSerializerOptions Options { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        DictionaryKeyPolicy = JsonNamingPolicy.SnakeCaseLower,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.KebabCaseLower) },
        WriteIndented = false,
    };
}

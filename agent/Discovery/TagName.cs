namespace LoopWatch.Agent.Discovery;

/// <summary>
/// A tag split by common naming patterns into the loop it belongs to and the part it plays:
/// <c>area/FIC-101/pv</c> (topic levels), <c>FIC-101.PV</c> (dotted suffix), <c>FIC_101_PV</c> (underscore suffix);
/// in a Sparkplug tag the same patterns apply to the metric name.
/// </summary>
public readonly record struct TagName(string LoopKey, string LoopId, TagRole Role, string Pattern)
{
    // Common practice, no source: the words controllers and historians use for a loop's parts.
    private static readonly Dictionary<string, TagRole> Words = new(StringComparer.OrdinalIgnoreCase)
    {
        ["pv"] = TagRole.Pv, ["meas"] = TagRole.Pv,
        ["sp"] = TagRole.Sp, ["sv"] = TagRole.Sp, ["setpoint"] = TagRole.Sp,
        ["op"] = TagRole.Op, ["out"] = TagRole.Op, ["output"] = TagRole.Op, ["mv"] = TagRole.Op,
        ["mode"] = TagRole.Mode,
        ["zt"] = TagRole.Position, ["pos"] = TagRole.Position, ["position"] = TagRole.Position,
        ["cv"] = TagRole.Cv,
    };

    /// <summary>Splits <paramref name="tag"/>; false when its last name part is no loop-part word.</summary>
    public static bool TryParse(string tag, out TagName name)
    {
        name = default;
        var colon = Sparkplug.SparkplugTag.IsSparkplug(tag) ? tag.IndexOf(':') : -1;
        var start = colon + 1;
        // In a Sparkplug tag only the metric name is searched, so the dot of the namespace is never a suffix.
        var cut = tag.LastIndexOfAny(['/', '.', '_']);
        if (cut <= start || cut == tag.Length - 1) return false;
        if (!Words.TryGetValue(tag[(cut + 1)..], out var role)) return false;
        var key = tag[..cut];
        var id = key[(Math.Max(key.LastIndexOf('/'), key.LastIndexOf(':')) + 1)..];
        if (id.Length == 0) return false;
        var pattern = tag[cut] switch
        {
            '/' => "<loop>/<part> (topic levels)",
            '.' => "<loop>.<part> (dotted suffix)",
            _ => "<loop>_<part> (underscore suffix)",
        };
        if (colon >= 0) pattern += " in a Sparkplug metric name";
        name = new TagName(key, id, role, pattern);
        return true;
    }
}

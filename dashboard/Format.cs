using System.Globalization;

namespace LoopWatch.Dashboard;

/// <summary>Number and time formatting shared by the pages.</summary>
public static class Format
{
    /// <summary>A value with sensible significant digits, or a dash when there is none.</summary>
    public static string Value(double? v) => v switch
    {
        null => "–",
        { } x when Math.Abs(x) >= 1000 => x.ToString("0", CultureInfo.InvariantCulture),
        { } x when Math.Abs(x) >= 100 => x.ToString("0.0", CultureInfo.InvariantCulture),
        { } x => x.ToString("0.00", CultureInfo.InvariantCulture),
    };

    /// <summary>How long ago, in plant time.</summary>
    public static string Age(DateTimeOffset? at, DateTimeOffset now)
    {
        if (at is null) return "never";
        var s = Math.Max(0, (now - at.Value).TotalSeconds);
        return s < 90 ? $"{s:0} s ago" : s < 5400 ? $"{s / 60:0} min ago" : $"{s / 3600:0.0} h ago";
    }

    /// <summary>A plant time as shown on pages (UTC, ISO-like).</summary>
    public static string Time(DateTimeOffset? t) => t?.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss 'UTC'", CultureInfo.InvariantCulture) ?? "–";
}

namespace LoopWatch.Analytics.Configuration;

/// <summary>A daily window of local plant time in minutes after midnight; <see cref="End"/> below <see cref="Start"/> crosses midnight.</summary>
public readonly record struct AlarmWindow(int Start, int End)
{
    /// <summary>True when <paramref name="minuteOfDay"/> lies in the window (start inclusive, end exclusive).</summary>
    public bool Contains(int minuteOfDay) =>
        Start <= End ? minuteOfDay >= Start && minuteOfDay < End : minuteOfDay >= Start || minuteOfDay < End;

    /// <summary>Parses <c>HH:mm-HH:mm</c>; false when the text is not of that form.</summary>
    public static bool TryParse(string? text, out AlarmWindow window)
    {
        window = default;
        var parts = text?.Split('-', StringSplitOptions.TrimEntries);
        if (parts is not { Length: 2 }) return false;
        if (!TryMinute(parts[0], out var start) || !TryMinute(parts[1], out var end) || start == end) return false;
        window = new AlarmWindow(start, end);
        return true;
    }

    private static bool TryMinute(string s, out int minute)
    {
        minute = 0;
        var hm = s.Split(':');
        if (hm.Length != 2 || !int.TryParse(hm[0], out var h) || !int.TryParse(hm[1], out var m)) return false;
        if (h is < 0 or > 24 || m is < 0 or > 59 || (h == 24 && m != 0)) return false;
        minute = h * 60 + m;
        return true;
    }
}

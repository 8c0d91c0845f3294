using System.Globalization;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// ISO 8601 timestamps with <c>Z</c> or an offset, as the payload decoder takes them; a time without a zone is refused.
/// Remembers the last text it parsed, because historian exports repeat one timestamp over many rows.
/// </summary>
public sealed class ZonedTimestamp
{
    private static readonly long Epoch = DateTimeOffset.UnixEpoch.UtcTicks;
    private readonly char[] _last = new char[48];
    private int _lastLength = -1;
    private long _lastTicks;

    /// <summary>Parses <paramref name="text"/> into UTC ticks; false when it is not a zoned ISO 8601 time after 1970.</summary>
    public bool TryParse(ReadOnlySpan<char> text, out long ticks)
    {
        text = text.Trim();
        if (text.Length == _lastLength && text.SequenceEqual(_last.AsSpan(0, _lastLength)))
        {
            ticks = _lastTicks;
            return true;
        }
        ticks = 0;
        var zoned = text.Length > 6 && (text[^1] is 'Z' or 'z' || (text[^6] is '+' or '-' && text[^3] == ':'));
        if (!zoned || text.Length > _last.Length || text.Length < 11 || text[4] != '-') return false;
        if (!TryCommon(text, out ticks))
        {
            if (!DateTimeOffset.TryParse(text, CultureInfo.InvariantCulture, DateTimeStyles.None, out var time)) return false;
            ticks = time.UtcTicks;
        }
        if (ticks < Epoch) return false;
        text.CopyTo(_last);
        _lastLength = text.Length;
        _lastTicks = ticks;
        return true;
    }

    /// <summary>
    /// The form exports nearly always use, <c>yyyy-MM-ddTHH:mm:ss[.fffffff](Z|+hh:mm|-hh:mm)</c> from 1970 on, read
    /// directly (the general parser costs more than the rest of a row); false sends anything else to the general parser.
    /// </summary>
    private static bool TryCommon(ReadOnlySpan<char> t, out long ticks)
    {
        ticks = 0;
        if (t.Length < 20 || t[4] != '-' || t[7] != '-' || t[10] != 'T' || t[13] != ':' || t[16] != ':') return false;
        if (!Digits(t, 0, 4, out var year) || !Digits(t, 5, 2, out var month) || !Digits(t, 8, 2, out var day)
            || !Digits(t, 11, 2, out var hour) || !Digits(t, 14, 2, out var minute) || !Digits(t, 17, 2, out var second)) return false;
        if (year is < 1970 or > 9998 || month is < 1 or > 12 || day < 1 || day > DateTime.DaysInMonth(year, month)
            || hour > 23 || minute > 59 || second > 59) return false;
        var i = 19;
        long fraction = 0;
        if (t[i] == '.')
        {
            var start = ++i;
            while (i < t.Length && (uint)(t[i] - '0') <= 9) fraction = fraction * 10 + (t[i++] - '0');
            var n = i - start;
            if (n is 0 or > 7) return false;
            for (; n < 7; n++) fraction *= 10;
        }
        var zone = t[i..];
        long offset;
        if (zone is ['Z']) offset = 0;
        else if (zone.Length == 6 && zone[0] is '+' or '-' && zone[3] == ':' && Digits(zone, 1, 2, out var oh) && Digits(zone, 4, 2, out var om)
            && oh < 14 && om < 60)
            offset = (zone[0] == '-' ? -1 : 1) * (oh * 60L + om) * TimeSpan.TicksPerMinute;
        else return false;
        ticks = new DateTime(year, month, day, hour, minute, second).Ticks + fraction - offset;
        return true;
    }

    private static bool Digits(ReadOnlySpan<char> t, int at, int count, out int value)
    {
        value = 0;
        for (var i = at; i < at + count; i++)
        {
            var d = (uint)(t[i] - '0');
            if (d > 9) return false;
            value = value * 10 + (int)d;
        }
        return true;
    }
}

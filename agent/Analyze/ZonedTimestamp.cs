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
        if (!DateTimeOffset.TryParse(text, CultureInfo.InvariantCulture, DateTimeStyles.None, out var time)) return false;
        ticks = time.UtcTicks;
        if (ticks < Epoch) return false;
        text.CopyTo(_last);
        _lastLength = text.Length;
        _lastTicks = ticks;
        return true;
    }
}

using System.Globalization;

namespace LoopWatch.Dashboard.Reports;

/// <summary>One shift: [<see cref="Start"/>, <see cref="End"/>) in UTC, its number within the plant day and its local clock times.</summary>
public sealed record ShiftWindow(DateTimeOffset Start, DateTimeOffset End, int Number, DateTime LocalStart, DateTime LocalEnd)
{
    /// <summary>For headings, e.g. "Shift 2 · Mon 2026-03-02 14:00–22:00".</summary>
    public string Label => string.Create(CultureInfo.InvariantCulture, $"Shift {Number} · {LocalStart:ddd yyyy-MM-dd HH:mm}–{LocalEnd:HH:mm}");

    /// <summary>True when <paramref name="time"/> falls in the shift.</summary>
    public bool Contains(DateTimeOffset time) => time >= Start && time < End;
}

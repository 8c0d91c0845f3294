namespace LoopWatch.Dashboard.Reports;

/// <summary>An ISO week (Monday 00:00 to the next Monday 00:00) in the plant's time zone, with its bounds in UTC.</summary>
public sealed record ReportWeek(DateOnly Monday, DateTimeOffset Start, DateTimeOffset End, TimeZoneInfo Zone)
{
    /// <summary>The week that contains <paramref name="day"/>.</summary>
    public static ReportWeek Containing(DateOnly day, TimeZoneInfo zone)
    {
        var monday = day.AddDays(-(((int)day.DayOfWeek + 6) % 7));
        return new ReportWeek(monday, Midnight(monday, zone), Midnight(monday.AddDays(7), zone), zone);
    }

    /// <summary>The last week that ended at or before <paramref name="now"/> in <paramref name="zone"/>.</summary>
    public static ReportWeek LastComplete(DateTimeOffset now, TimeZoneInfo zone) =>
        Containing(DateOnly.FromDateTime(TimeZoneInfo.ConvertTime(now, zone).DateTime), zone).Before();

    /// <summary>The week before this one.</summary>
    public ReportWeek Before() => Containing(Monday.AddDays(-7), Zone);

    /// <summary>The week after this one.</summary>
    public ReportWeek After() => Containing(Monday.AddDays(7), Zone);

    /// <summary>The Monday as <c>yyyy-MM-dd</c>, the form of the <c>week</c> query parameter.</summary>
    public string Key => Monday.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture);

    private static DateTimeOffset Midnight(DateOnly day, TimeZoneInfo zone)
    {
        var local = day.ToDateTime(TimeOnly.MinValue, DateTimeKind.Unspecified);
        while (zone.IsInvalidTime(local)) local = local.AddMinutes(30);
        return new DateTimeOffset(TimeZoneInfo.ConvertTimeToUtc(local, zone), TimeSpan.Zero);
    }
}

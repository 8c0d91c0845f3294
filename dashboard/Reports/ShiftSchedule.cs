namespace LoopWatch.Dashboard.Reports;

/// <summary>
/// The plant's shift pattern: shifts of <see cref="LengthHours"/> starting at <see cref="StartHour"/> local time in
/// <see cref="Zone"/> (for example three 8 h shifts from 06:00, or two 12 h shifts from 07:00). The zone also sets the
/// plant's calendar for weekly reports.
/// </summary>
public sealed record ShiftSchedule
{
    /// <summary>Three 8 h shifts from 06:00 UTC.</summary>
    public static ShiftSchedule Default { get; } = new(6, 8, TimeZoneInfo.Utc);

    /// <summary>A schedule; the length must divide a day into whole shifts.</summary>
    public ShiftSchedule(int startHour, int lengthHours, TimeZoneInfo zone)
    {
        if (startHour is < 0 or > 23) throw new ArgumentOutOfRangeException(nameof(startHour), "must be 0..23");
        if (lengthHours is < 1 or > 24 || 24 % lengthHours != 0) throw new ArgumentOutOfRangeException(nameof(lengthHours), "must divide 24");
        StartHour = startHour;
        LengthHours = lengthHours;
        Zone = zone ?? throw new ArgumentNullException(nameof(zone));
    }

    public int StartHour { get; }
    public int LengthHours { get; }
    public TimeZoneInfo Zone { get; }

    /// <summary>The shift that contains <paramref name="time"/>.</summary>
    public ShiftWindow At(DateTimeOffset time)
    {
        var local = TimeZoneInfo.ConvertTime(time, Zone).DateTime;
        var day = local.Date.AddHours(StartHour);
        if (local < day) day = day.AddDays(-1);
        var k = (int)((local - day).Ticks / TimeSpan.FromHours(LengthHours).Ticks);
        // Around a daylight-saving change the local arithmetic can land one shift off; step to the one that holds the time.
        while (time < Window(day, k).Start) k--;
        while (time >= Window(day, k).End) k++;
        return Window(day, k);
    }

    /// <summary>The shift before <paramref name="shift"/>.</summary>
    public ShiftWindow Previous(ShiftWindow shift) => At(shift.Start.AddTicks(-1));

    private ShiftWindow Window(DateTime day, int k)
    {
        var startLocal = day.AddHours(k * LengthHours);
        var endLocal = startLocal.AddHours(LengthHours);
        var perDay = 24 / LengthHours;
        var number = ((k % perDay) + perDay) % perDay + 1;
        return new ShiftWindow(ToPlant(startLocal), ToPlant(endLocal), number, startLocal, endLocal);
    }

    // A local time skipped by a spring-forward change starts at the first valid time after the gap.
    private DateTimeOffset ToPlant(DateTime local)
    {
        var unspecified = DateTime.SpecifyKind(local, DateTimeKind.Unspecified);
        while (Zone.IsInvalidTime(unspecified)) unspecified = unspecified.AddMinutes(30);
        return new DateTimeOffset(TimeZoneInfo.ConvertTimeToUtc(unspecified, Zone), TimeSpan.Zero);
    }
}

using LoopWatch.Dashboard.Reports;

namespace LoopWatch.Dashboard.Tests.Reports;

public sealed class ShiftScheduleTests
{
    private static DateTimeOffset T(string s) => DateTimeOffset.Parse(s, System.Globalization.CultureInfo.InvariantCulture);

    [Theory]
    [InlineData("2026-03-02T05:59:59Z", "2026-03-01T22:00:00Z", "2026-03-02T06:00:00Z", 3)]
    [InlineData("2026-03-02T06:00:00Z", "2026-03-02T06:00:00Z", "2026-03-02T14:00:00Z", 1)]
    [InlineData("2026-03-02T14:00:00Z", "2026-03-02T14:00:00Z", "2026-03-02T22:00:00Z", 2)]
    [InlineData("2026-03-02T23:30:00Z", "2026-03-02T22:00:00Z", "2026-03-03T06:00:00Z", 3)]
    public void Default_schedule_has_three_eight_hour_shifts_from_six(string at, string start, string end, int number)
    {
        var shift = ShiftSchedule.Default.At(T(at));
        Assert.Equal((T(start), T(end), number), (shift.Start, shift.End, shift.Number));
        Assert.True(shift.Contains(T(at)));
    }

    [Fact]
    public void The_previous_shift_ends_where_the_current_one_starts()
    {
        var current = ShiftSchedule.Default.At(T("2026-03-02T07:00:00Z"));
        var previous = ShiftSchedule.Default.Previous(current);
        Assert.Equal(T("2026-03-01T22:00:00Z"), previous.Start);
        Assert.Equal(current.Start, previous.End);
    }

    [Fact]
    public void Two_twelve_hour_shifts_in_a_european_zone_follow_the_clock_change()
    {
        // EU summer time starts on the last Sunday of March at 01:00 UTC (Directive 2000/84/EC): 2026-03-29.
        var berlin = TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin");
        var schedule = new ShiftSchedule(7, 12, berlin);
        var night = schedule.At(T("2026-03-29T03:00:00Z"));
        Assert.Equal(T("2026-03-28T18:00:00Z"), night.Start); // 19:00 CET
        Assert.Equal(T("2026-03-29T05:00:00Z"), night.End);   // 07:00 CEST: an 11-hour night
        Assert.Equal(2, night.Number);
        var day = schedule.At(T("2026-03-29T05:00:00Z"));
        Assert.Equal((T("2026-03-29T05:00:00Z"), T("2026-03-29T17:00:00Z"), 1), (day.Start, day.End, day.Number));
    }

    [Theory]
    [InlineData(6, 5)]
    [InlineData(24, 8)]
    [InlineData(6, 0)]
    public void A_schedule_that_does_not_divide_the_day_is_refused(int start, int length) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => new ShiftSchedule(start, length, TimeZoneInfo.Utc));

    [Fact]
    public void The_last_complete_week_is_the_iso_week_before_the_current_one()
    {
        // Wednesday 2026-03-11: the last complete ISO week (Monday start, ISO 8601) is Monday 2026-03-02.
        var w = ReportWeek.LastComplete(T("2026-03-11T10:00:00Z"), TimeZoneInfo.Utc);
        Assert.Equal(new DateOnly(2026, 3, 2), w.Monday);
        Assert.Equal((T("2026-03-02T00:00:00Z"), T("2026-03-09T00:00:00Z")), (w.Start, w.End));
        // A Sunday belongs to the week that began six days before.
        Assert.Equal(new DateOnly(2026, 3, 2), ReportWeek.Containing(new DateOnly(2026, 3, 8), TimeZoneInfo.Utc).Monday);
    }
}

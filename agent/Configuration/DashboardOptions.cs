namespace LoopWatch.Agent.Configuration;

/// <summary>Where the dashboard listens; loopback by default.</summary>
public sealed class DashboardOptions
{
    public string Urls { get; set; } = "http://127.0.0.1:5080";

    /// <summary>When true, even viewing needs a login; changes always need one. Default false.</summary>
    public bool RequireLoginToView { get; set; }

    /// <summary>
    /// Who may read <c>/metrics</c>: <c>viewing</c> (default; like the pages, open unless <see cref="RequireLoginToView"/>),
    /// <c>open</c> (always, for a scraper that cannot log in) or <c>off</c> (no endpoint).
    /// </summary>
    public string MetricsAccess { get; set; } = "viewing";

    /// <summary>Hour of day (plant time zone) the first shift starts; default 6.</summary>
    public int ShiftStartHour { get; set; } = 6;

    /// <summary>Length of a shift in hours, dividing 24 (8 for three shifts, 12 for two); default 8.</summary>
    public int ShiftHours { get; set; } = 8;

    /// <summary>Plant time zone (IANA id) for shifts and weekly summaries; default UTC.</summary>
    public string TimeZone { get; set; } = "UTC";

    /// <summary>
    /// Database files of the other agents sharing the plant by shard, merged read-only into the weekly page; default none.
    /// </summary>
    public List<string> WeeklyDatabases { get; set; } = [];
}

namespace LoopWatch.Agent.Configuration;

/// <summary>Where the dashboard listens; loopback by default.</summary>
public sealed class DashboardOptions
{
    public string Urls { get; set; } = "http://127.0.0.1:5080";

    /// <summary>When true, even viewing needs a login; changes always need one. Default false.</summary>
    public bool RequireLoginToView { get; set; }
}

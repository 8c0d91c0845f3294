namespace LoopWatch.Agent.Configuration;

/// <summary>Where the dashboard listens; loopback by default.</summary>
public sealed class DashboardOptions
{
    public string Urls { get; set; } = "http://127.0.0.1:5080";
}

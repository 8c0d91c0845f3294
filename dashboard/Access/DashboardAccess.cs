namespace LoopWatch.Dashboard.Access;

/// <summary>Access settings of the dashboard: whether viewing needs a login.</summary>
public sealed record DashboardAccess(bool RequireLoginToView);

namespace LoopWatch.Agent.Analyze;

/// <summary>The output forms of <c>loopwatch analyze</c>.</summary>
public enum ReportFormat
{
    Text,
    Json,
    Csv,
    Html,
}

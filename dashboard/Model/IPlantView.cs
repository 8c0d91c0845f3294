namespace LoopWatch.Dashboard.Model;

/// <summary>The live state the dashboard reads; the agent implements it, so the dashboard never sees MQTT.</summary>
public interface IPlantView
{
    /// <summary>The plant's clock: event time of the latest data, advanced by the wall clock in between.</summary>
    DateTimeOffset Now { get; }

    /// <summary>Every loop, in configuration order.</summary>
    IReadOnlyList<LoopView> Loops();

    /// <summary>One loop, or null when no loop has that id.</summary>
    LoopView? Loop(string id);

    /// <summary>The trend of one loop over the last <paramref name="span"/>, oldest first.</summary>
    IReadOnlyList<TrendPoint> Trend(string id, TimeSpan span);

    /// <summary>Ingest counters for the health check.</summary>
    IngestCounters Counters();
}

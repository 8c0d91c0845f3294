namespace LoopWatch.Analytics.Configuration;

/// <summary>The measured variable's kind; fast loops (flow, pressure) get shorter delays than slow ones (level, temperature).</summary>
public enum ProcessKind
{
    Flow,
    Level,
    Pressure,
    Temperature,
    Other,
}

namespace LoopWatch.Dashboard.Model;

/// <summary>The final elements the maintenance page shows, and recording a service (which starts a new counting period).</summary>
public interface IValveView
{
    /// <summary>Every final element, ranked by wear rate (travel per day), highest first.</summary>
    IReadOnlyList<ValveView> Valves();

    /// <summary>Closes the counting period of an element and starts a new one at zero; false when there is no such element.</summary>
    bool RecordService(string loopId, string element, string user, string? note);
}

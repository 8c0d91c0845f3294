namespace LoopWatch.Dashboard.Model;

/// <summary>How many activations one alarm had.</summary>
public sealed record AlarmCount(string Id, string LoopId, string Kind, int Activations);

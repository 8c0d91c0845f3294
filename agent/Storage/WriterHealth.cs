using LoopWatch.Dashboard.Model;

namespace LoopWatch.Agent.Storage;

/// <summary>The agent's storage writer seen by the dashboard: its fault and backlog.</summary>
public sealed class WriterHealth(AgentStorage storage) : IStorageHealth
{
    /// <inheritdoc />
    public StorageHealth Current()
    {
        var writer = storage.Writer;
        var fault = writer.Fault;
        var c = writer.Counters;
        return new StorageHealth(fault?.Text, fault?.Since, c.Pending, c.Dropped, c.Written);
    }
}

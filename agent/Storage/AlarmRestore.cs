using LoopWatch.Agent.Alarms;
using Microsoft.Extensions.Hosting;

namespace LoopWatch.Agent.Storage;

/// <summary>At start, before ingest, takes the stored alarm states back into the engine (active alarms, acknowledgements, shelves, out of service).</summary>
public sealed class AlarmRestore(AgentStorage storage, AlarmEngine engine) : IHostedService
{
    /// <inheritdoc />
    public async Task StartAsync(CancellationToken cancellationToken)
    {
        var rows = await storage.Reader.ReadAlarmStatesAsync(cancellationToken);
        engine.Restore(rows.Select(r => AlarmJournal.FromRow(r)).OfType<AlarmStatus>());
    }

    /// <inheritdoc />
    public Task StopAsync(CancellationToken cancellationToken) => Task.CompletedTask;
}

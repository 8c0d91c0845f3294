using Microsoft.Extensions.Hosting;

namespace LoopWatch.Agent.Storage;

/// <summary>Opens the database before anything else starts and, being registered first, closes it after everything else has stopped.</summary>
public sealed class StorageLifetime(AgentStorage storage) : IHostedService
{
    /// <inheritdoc />
    public Task StartAsync(CancellationToken cancellationToken)
    {
        storage.Open();
        return Task.CompletedTask;
    }

    /// <inheritdoc />
    public Task StopAsync(CancellationToken cancellationToken) => storage.CloseAsync();
}

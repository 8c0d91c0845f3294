using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Retention;
using LoopWatch.Storage.Users;
using LoopWatch.Storage.Writing;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Storage;

/// <summary>Registers the storage services as singletons; the container's async dispose flushes the writer.</summary>
public static class StorageServiceCollectionExtensions
{
    /// <summary>Adds <see cref="LoopWatchDatabase"/> (opened and migrated on first use), <see cref="StorageWriter"/>,
    /// <see cref="StorageReader"/>, <see cref="UserStore"/> and <see cref="RetentionPruner"/>.</summary>
    public static IServiceCollection AddLoopWatchStorage(this IServiceCollection services, StorageOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        services.TryAddSingleton(TimeProvider.System);
        services.AddSingleton(sp => LoopWatchDatabase.Open(options, sp.GetService<ILogger<LoopWatchDatabase>>()));
        services.AddSingleton(sp => new StorageWriter(
            sp.GetRequiredService<LoopWatchDatabase>(), sp.GetRequiredService<TimeProvider>(),
            sp.GetService<ILogger<StorageWriter>>()));
        services.AddSingleton(sp => new StorageReader(sp.GetRequiredService<LoopWatchDatabase>()));
        services.AddSingleton(sp => new UserStore(sp.GetRequiredService<LoopWatchDatabase>()));
        services.AddSingleton(sp => new RetentionPruner(
            sp.GetRequiredService<LoopWatchDatabase>(), sp.GetRequiredService<TimeProvider>()));
        return services;
    }
}

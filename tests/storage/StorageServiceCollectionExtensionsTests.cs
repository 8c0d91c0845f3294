using Dapper;
using LoopWatch.Storage.Reading;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Writing;
using Microsoft.Extensions.DependencyInjection;

namespace LoopWatch.Storage.Tests;

public sealed class StorageServiceCollectionExtensionsTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task AddLoopWatchStorage_ResolvesServices_AndDisposingTheContainerFlushesTheWriter()
    {
        var provider = new ServiceCollection().AddLoopWatchStorage(_temp.Options()).BuildServiceProvider();

        var writer = provider.GetRequiredService<StorageWriter>();
        Assert.Same(provider.GetRequiredService<LoopWatchDatabase>(), provider.GetRequiredService<LoopWatchDatabase>());
        Assert.NotNull(provider.GetRequiredService<StorageReader>());
        for (var i = 0; i < 100; i++) writer.Post(SampleRows.Journal(i, "FIC-150"));
        await provider.DisposeAsync();

        using var raw = _temp.OpenRaw();
        Assert.Equal(100, raw.ExecuteScalar<long>("SELECT count(*) FROM alarm_journal WHERE loop_id = 'FIC-150'"));
    }
}

namespace LoopWatch.Dashboard.Model;

/// <summary>The host's database writer state, shown on <c>/healthz</c> and as a banner on every page while it fails.</summary>
public interface IStorageHealth
{
    /// <summary>The writer's state now.</summary>
    StorageHealth Current();
}

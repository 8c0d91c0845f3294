namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>Waits for a condition that real components reach asynchronously; a bounded wait, never a fixed sleep.</summary>
public static class Eventually
{
    public static async Task<T> Until<T>(Func<Task<T>> probe, Func<T, bool> done, TimeSpan? timeout = null, string? what = null)
    {
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var limit = timeout ?? TimeSpan.FromSeconds(15);
        T last = await probe();
        while (!done(last))
        {
            if (clock.Elapsed > limit) throw new TimeoutException($"condition not met in time: {what}; last value: {last}");
            await Task.Delay(50);
            last = await probe();
        }
        return last;
    }
}

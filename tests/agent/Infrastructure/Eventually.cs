namespace LoopWatch.Agent.Tests.Infrastructure;

/// <summary>
/// Waits for a condition that real components reach asynchronously; a bounded wait, never a fixed sleep. The bound
/// (60 s unless given) only turns a hang into a failure: 15 s was too short on a loaded CI machine.
/// </summary>
public static class Eventually
{
    public static async Task<T> Until<T>(Func<Task<T>> probe, Func<T, bool> done, TimeSpan? timeout = null, string? what = null)
    {
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var limit = timeout ?? TimeSpan.FromSeconds(60);
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

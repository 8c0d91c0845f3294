namespace LoopWatch.Storage.Tests.Support;

/// <summary>Waits for a condition with a generous bound; the bound only turns a hang into a failure, it is never the check.</summary>
public static class Eventually
{
    public static async Task TrueAsync(Func<bool> condition, string what, Action? eachTry = null, int timeoutSeconds = 60)
    {
        var deadline = DateTime.UtcNow.AddSeconds(timeoutSeconds);
        while (!condition())
        {
            if (DateTime.UtcNow > deadline) Assert.Fail($"Timed out waiting for: {what}");
            eachTry?.Invoke();
            await Task.Delay(10);
        }
    }
}

using System.Collections.Concurrent;

namespace LoopWatch.Dashboard.Access;

/// <summary>
/// Slows password guessing: after 5 failures for a user name within 15 minutes, that name is locked for 15 minutes
/// (a common lockout policy, no single source). Counts are per name, kept in memory.
/// </summary>
public sealed class LoginThrottle(TimeProvider time)
{
    public const int MaxFailures = 5;
    public static readonly TimeSpan Window = TimeSpan.FromMinutes(15);

    private readonly ConcurrentDictionary<string, (int Failures, DateTimeOffset First)> _failures = new(StringComparer.OrdinalIgnoreCase);

    /// <summary>True while the name is locked out.</summary>
    public bool IsLocked(string name) =>
        _failures.TryGetValue(name, out var f) && f.Failures >= MaxFailures && time.GetUtcNow() - f.First < Window;

    /// <summary>Counts one failed attempt.</summary>
    public void Failed(string name)
    {
        var now = time.GetUtcNow();
        _failures.AddOrUpdate(name, (1, now), (_, f) => now - f.First >= Window ? (1, now) : (f.Failures + 1, f.First));
        // Bound memory against attempts with endless made-up names.
        if (_failures.Count > 10_000) _failures.Clear();
    }

    /// <summary>Clears the count after a successful login.</summary>
    public void Succeeded(string name) => _failures.TryRemove(name, out _);
}

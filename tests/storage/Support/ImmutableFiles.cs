using System.Diagnostics;

namespace LoopWatch.Storage.Tests.Support;

/// <summary>
/// Files made immutable (<c>chattr +i</c>, Debian's e2fsprogs): even root's writes through descriptors already open are
/// refused with EPERM, and a new open for writing fails. Dispose clears the flag, also when the test failed, so the
/// folder can be deleted. A missing chattr or a file system that refuses the flag fails the test; it never skips.
/// Also compiled into the agent tests.
/// </summary>
public sealed class ImmutableFiles : IDisposable
{
    private readonly string[] _paths;
    private int _cleared;

    private ImmutableFiles(string[] paths) => _paths = paths;

    /// <summary>Sets the flag on every path (files or folders, which must exist).</summary>
    public static ImmutableFiles Set(params string[] paths)
    {
        foreach (var path in paths)
            if (!File.Exists(path) && !Directory.Exists(path)) throw new InvalidOperationException($"{path} does not exist, nothing to make read-only");
        Chattr("+i", paths);
        return new ImmutableFiles(paths);
    }

    /// <summary>Clears the flag (once).</summary>
    public void Dispose()
    {
        if (Interlocked.Exchange(ref _cleared, 1) == 0) Chattr("-i", _paths);
    }

    private static void Chattr(string flag, string[] paths)
    {
        Process p;
        try
        {
            p = Process.Start(new ProcessStartInfo("chattr", [flag, .. paths]) { RedirectStandardError = true, UseShellExecute = false })!;
        }
        catch (System.ComponentModel.Win32Exception e)
        {
            throw new InvalidOperationException($"chattr could not be run ({e.Message}): run ./test.sh, which installs the Debian package 'e2fsprogs'", e);
        }
        using (p)
        {
            var err = p.StandardError.ReadToEnd();
            p.WaitForExit();
            if (p.ExitCode != 0)
                throw new InvalidOperationException($"chattr {flag} {string.Join(' ', paths)} failed ({p.ExitCode}): {err.Trim()}; " +
                    "the read-only database tests need root (CI runs ./test.sh as root) and a file system with the immutable flag (ext4, xfs, btrfs; not tmpfs)");
        }
    }
}

using System.Security.Cryptography;
using System.Threading.Channels;
using LoopWatch.Agent.Configuration;
using LoopWatch.Agent.Service;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LoopWatch.Agent.Reload;

/// <summary>
/// Watches the configuration file (<c>run</c> only) and reloads its loops once the file has been quiet for
/// <see cref="Quiet"/>, so an editor's several writes or a write-and-rename give one reload. Unchanged content is skipped.
/// </summary>
public sealed class ConfigurationWatcher(ConfigurationSource source, LoopReload reload, TimeProvider time, ILogger<ConfigurationWatcher> log) : BackgroundService
{
    /// <summary>How long the file must stay unchanged before it is read.</summary>
    public static readonly TimeSpan Quiet = TimeSpan.FromMilliseconds(500);

    /// <inheritdoc />
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        var file = Path.GetFullPath(source.File);
        var last = Hash(file);
        var poked = Channel.CreateBounded<bool>(new BoundedChannelOptions(1) { FullMode = BoundedChannelFullMode.DropWrite });
        // The folder, not the file: editors and deployment tools replace the file by a rename, which ends a watch on the file itself.
        using var watcher = new FileSystemWatcher(Path.GetDirectoryName(file)!)
        {
            NotifyFilter = NotifyFilters.FileName | NotifyFilters.LastWrite | NotifyFilters.Size | NotifyFilters.CreationTime,
        };
        void Poke(object? _, FileSystemEventArgs e)
        {
            if (Same(e.FullPath, file) || (e is RenamedEventArgs r && Same(r.OldFullPath, file))) poked.Writer.TryWrite(true);
        }
        watcher.Changed += Poke;
        watcher.Created += Poke;
        watcher.Renamed += Poke;
        watcher.Error += (_, e) => ServiceLog.WatchFailed(log, file, e.GetException().Message);
        watcher.EnableRaisingEvents = true;
        try
        {
            while (await poked.Reader.WaitToReadAsync(stoppingToken))
            {
                poked.Reader.TryRead(out _);
                do await Task.Delay(Quiet, time, stoppingToken);
                while (poked.Reader.TryRead(out _));
                // Mid-rename the file may be missing for a moment; its Created or Renamed event follows.
                if (Hash(file) is not { } now || now.SequenceEqual(last ?? [])) continue;
                last = now;
                try { await reload.ApplyAsync(source, stoppingToken); }
                catch (Exception e) when (e is not OperationCanceledException) { ServiceLog.ReloadRefused(log, file, e.Message); }
            }
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested) { }
    }

    private static bool Same(string a, string b) => string.Equals(Path.GetFullPath(a), b, StringComparison.Ordinal);

    private static byte[]? Hash(string file)
    {
        try { return SHA256.HashData(File.ReadAllBytes(file)); }
        catch (IOException) { return null; }
        catch (UnauthorizedAccessException) { return null; }
    }
}

using System.Diagnostics;

namespace LoopWatch.Agent.Bench;

/// <summary>CPU time of this process over a span of wall time, and its peak resident memory sampled every 250 ms.</summary>
internal sealed class ProcessGauge : IAsyncDisposable
{
    private readonly CancellationTokenSource _stop = new();
    private readonly Task _sampler;
    private long _peakRss;
    private TimeSpan _cpuStart;
    private long _wallStart;

    public ProcessGauge()
    {
        _sampler = Task.Run(async () =>
        {
            while (!_stop.IsCancellationRequested)
            {
                Sample();
                await Task.Delay(250, _stop.Token).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
            }
        });
    }

    /// <summary>Starts the CPU span.</summary>
    public void Mark()
    {
        _cpuStart = Cpu();
        _wallStart = Stopwatch.GetTimestamp();
    }

    /// <summary>CPU seconds per wall second since <see cref="Mark"/>: the cores used on average.</summary>
    public double Cores()
    {
        var wall = Stopwatch.GetElapsedTime(_wallStart).TotalSeconds;
        return wall > 0 ? (Cpu() - _cpuStart).TotalSeconds / wall : 0;
    }

    /// <summary>CPU seconds used since <see cref="Mark"/>.</summary>
    public double CpuSeconds() => (Cpu() - _cpuStart).TotalSeconds;

    /// <summary>Peak resident set seen so far, in MB.</summary>
    public double PeakRssMb
    {
        get
        {
            Sample();
            return Interlocked.Read(ref _peakRss) / (1024.0 * 1024.0);
        }
    }

    private void Sample()
    {
        var rss = Environment.WorkingSet;
        long seen;
        while (rss > (seen = Interlocked.Read(ref _peakRss)) && Interlocked.CompareExchange(ref _peakRss, rss, seen) != seen) { }
    }

    private static TimeSpan Cpu()
    {
        using var p = Process.GetCurrentProcess();
        return p.TotalProcessorTime;
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        await _stop.CancelAsync();
        await _sampler;
        _stop.Dispose();
    }
}

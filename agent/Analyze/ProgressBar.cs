namespace LoopWatch.Agent.Analyze;

/// <summary>A one-line progress bar on a terminal; redrawn only when the whole percentage changes.</summary>
public sealed class ProgressBar(TextWriter terminal)
{
    private int _shown = -1;

    /// <summary>Shows <paramref name="done"/> of <paramref name="total"/> bytes.</summary>
    public void Show(long done, long total)
    {
        var pct = total <= 0 ? 100 : (int)Math.Clamp(done * 100 / total, 0, 100);
        if (pct == _shown) return;
        _shown = pct;
        var bar = new string('#', pct / 4).PadRight(25, '.');
        terminal.Write($"\ranalyzing [{bar}] {pct,3}%  {done / (1024 * 1024)} of {total / (1024 * 1024)} MB");
        if (pct == 100) terminal.WriteLine();
    }
}

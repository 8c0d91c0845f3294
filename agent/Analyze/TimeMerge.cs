namespace LoopWatch.Agent.Analyze;

/// <summary>
/// K-way merge of several historian readers by timestamp: each reader streams in its own order and the merge always
/// takes the earliest pending value (ties go to the file named first), holding one value per file.
/// </summary>
public sealed class TimeMerge
{
    private readonly PriorityQueue<(HistorianReader Reader, int Index), (long Ticks, int Index)> _queue = new();
    private HistorianReader? _top;
    private int _topIndex;

    /// <summary>A merge over <paramref name="readers"/>, in the order the files were named.</summary>
    public TimeMerge(IReadOnlyList<HistorianReader> readers)
    {
        for (var i = 0; i < readers.Count; i++)
            if (readers[i].MoveNext()) _queue.Enqueue((readers[i], i), (readers[i].Current.Ticks, i));
        Pop();
    }

    /// <summary>Takes the earliest pending value; false when every file is done.</summary>
    public bool Next(out TagRecord record)
    {
        if (_top is null) { record = default; return false; }
        record = _top.Current;
        if (!_top.MoveNext()) { Pop(); return true; }
        // Most of the time the same file stays earliest: skip the queue unless another file is now ahead.
        if (_queue.TryPeek(out _, out var head) && (head.Ticks < _top.Current.Ticks || (head.Ticks == _top.Current.Ticks && head.Index < _topIndex)))
        {
            var (reader, index) = _queue.EnqueueDequeue((_top, _topIndex), (_top.Current.Ticks, _topIndex));
            _top = reader;
            _topIndex = index;
        }
        return true;
    }

    private void Pop()
    {
        if (_queue.TryDequeue(out var e, out _)) { _top = e.Reader; _topIndex = e.Index; }
        else _top = null;
    }
}

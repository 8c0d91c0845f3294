namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Counters of everything the reader skipped: bad rows (the first few kept with file and line), values of unknown tags
/// (distinct names kept up to a bound so memory stays flat), rows out of time order within a file, and unreadable files.
/// </summary>
public sealed class RowRejects
{
    /// <summary>How many bad rows are kept as examples.</summary>
    public const int ExampleLimit = 10;

    /// <summary>How many distinct unknown tag names are kept.</summary>
    public const int UnknownTagLimit = 200;

    private readonly List<RejectedRow> _examples = [];
    private readonly Dictionary<string, long> _unknown = new(StringComparer.Ordinal);
    private readonly List<string> _files = [];

    /// <summary>Rows that could not be read.</summary>
    public long Rows { get; private set; }

    /// <summary>Values whose tag no loop uses.</summary>
    public long UnknownValues { get; private set; }

    /// <summary>Distinct unknown tag names seen (counted beyond <see cref="UnknownTagLimit"/> even when not kept).</summary>
    public long UnknownTagCount { get; private set; }

    /// <summary>Rows with a timestamp earlier than the row before them in the same file.</summary>
    public long OutOfOrder { get; internal set; }

    /// <summary>The first bad rows.</summary>
    public IReadOnlyList<RejectedRow> Examples => _examples;

    /// <summary>Unknown tags with their value counts, by name.</summary>
    public IReadOnlyDictionary<string, long> UnknownTags => _unknown;

    /// <summary>Files that could not be opened or read to the end, with the reason.</summary>
    public IReadOnlyList<string> FileErrors => _files;

    /// <summary>Counts a bad row.</summary>
    public void Row(string file, int line, string reason)
    {
        Rows++;
        if (_examples.Count < ExampleLimit) _examples.Add(new RejectedRow(file, line, reason));
    }

    /// <summary>Counts a value of an unknown tag.</summary>
    public void Unknown(ReadOnlySpan<char> tag, long values = 1)
    {
        UnknownValues += values;
        var lookup = _unknown.GetAlternateLookup<ReadOnlySpan<char>>();
        if (lookup.TryGetValue(tag, out var n)) { lookup[tag] = n + values; return; }
        UnknownTagCount++;
        if (_unknown.Count < UnknownTagLimit) lookup[tag] = values;
    }

    /// <summary>Notes a file that could not be read.</summary>
    public void File(string file, string reason) => _files.Add($"{file}: {reason}");
}

using System.IO.Compression;
using System.Text;
using LoopWatch.Agent.Ingest;
using LoopWatch.Analytics.Sampling;
using nietras.SeparatedValues;

namespace LoopWatch.Agent.Analyze;

/// <summary>
/// Streams one historian CSV export (plain or <c>.gz</c>) one value at a time, never holding more than Sep's row buffer.
/// Long format <c>timestamp,tag,value[,quality]</c> or wide format <c>timestamp,TAG1,TAG2,...</c>, told apart by the header.
/// Cells are decoded by the same rules as MQTT payloads (<see cref="PayloadDecoder"/>); bad rows are counted, not fatal.
/// </summary>
public sealed class HistorianReader : IDisposable
{
    private readonly FileStream _file;
    private readonly TextReader _text;
    private readonly SepReader _sep;
    private readonly RowRejects _rejects;
    private readonly Dictionary<string, TagRoute>.AlternateLookup<ReadOnlySpan<char>> _routes;
    private readonly ZonedTimestamp _time = new();
    private readonly byte[] _cell = new byte[256];
    private readonly bool _long;
    private readonly int _headerCols;
    private readonly TagRoute?[] _wideRoutes = [];
    private readonly long[] _wideUnknown = [];
    private readonly double[] _wideValues = [];
    private long _lastRowTicks = long.MinValue;
    private long _rowTicks;
    private int _col;
    private int _line;
    private bool _inRow, _done;

    /// <summary>Opens <paramref name="path"/> and reads its header; throws <see cref="InvalidDataException"/> when the header is not one of the two forms.</summary>
    public HistorianReader(string path, Dictionary<string, TagRoute> routes, RowRejects rejects)
    {
        Path = path;
        _rejects = rejects;
        _routes = routes.GetAlternateLookup<ReadOnlySpan<char>>();
        _file = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        // A pipe (`<(zcat ...)`, a FIFO) has no length: progress then shows bytes read without a total.
        Length = _file.CanSeek ? _file.Length : 0;
        Stream stream = path.EndsWith(".gz", StringComparison.OrdinalIgnoreCase) ? new GZipStream(_file, CompressionMode.Decompress) : _file;
        _text = new StreamReader(stream, Encoding.UTF8, detectEncodingFromByteOrderMarks: true, bufferSize: 1 << 16);
        try
        {
            _sep = Sep.Reader(o => o with { HasHeader = false, DisableColCountCheck = true, Unescape = true }).From(_text);
            if (!_sep.MoveNext()) { _done = true; Empty = true; return; }
            var header = _sep.Current;
            _line = header.LineNumberFrom;
            _headerCols = header.ColCount;
            var first = header[0].Span.Trim();
            if (_time.TryParse(first, out _)) throw new InvalidDataException("no header row (the first row holds data)");
            _long = _headerCols is 3 or 4 && Is(header[1].Span, "tag") && Is(header[2].Span, "value") && (_headerCols == 3 || Is(header[3].Span, "quality"));
            if (_long) return;
            if (_headerCols < 2) throw new InvalidDataException("the header names no tag column");
            _wideRoutes = new TagRoute?[_headerCols];
            _wideUnknown = new long[_headerCols];
            _wideValues = new double[_headerCols];
            WideNames = new string[_headerCols];
            for (var i = 1; i < _headerCols; i++)
            {
                var name = header[i].Span.Trim();
                WideNames[i] = name.ToString();
                _wideRoutes[i] = _routes.TryGetValue(name, out var r) ? r : null;
            }
        }
        catch
        {
            Dispose();
            throw;
        }
    }

    /// <summary>The file name as given.</summary>
    public string Path { get; }

    /// <summary>True for the long form (one value per row).</summary>
    public bool IsLong => _long;

    /// <summary>True when the file had not even a header.</summary>
    public bool Empty { get; }

    /// <summary>Size of the file on disk; 0 for a pipe.</summary>
    public long Length { get; }

    /// <summary>Bytes of the file read so far (compressed bytes for .gz).</summary>
    public long Position => _file.CanSeek ? _file.Position : Length;

    /// <summary>Data rows read (good and bad).</summary>
    public long Rows { get; private set; }

    /// <summary>The value the reader stands on after <see cref="MoveNext"/> returned true.</summary>
    public TagRecord Current { get; private set; }

    private string[] WideNames { get; } = [];

    /// <summary>Moves to the next good value; false at the end of the file.</summary>
    public bool MoveNext()
    {
        while (!_done)
        {
            if (_inRow && NextWideCell()) return true;
            _inRow = false;
            if (!NextRow()) break;
            if (_long) { if (LongRow()) return true; }
            else if (WideRow()) return true;
        }
        _done = true;
        FlushUnknownWide();
        return false;
    }

    private bool NextRow()
    {
        try
        {
            if (!_sep.MoveNext()) return false;
        }
        catch (Exception e) when (e is InvalidDataException or IOException or DecoderFallbackException)
        {
            // A corrupt .gz or an unreadable tail ends this file; what was read so far still counts.
            _rejects.File(Path, $"stopped reading after line {_line}: {e.Message}");
            return false;
        }
        _line = _sep.Current.LineNumberFrom;
        return true;
    }

    private bool LongRow()
    {
        var row = _sep.Current;
        if (row.ColCount == 1 && row[0].Span.Trim().IsEmpty) return false;
        Rows++;
        if (row.ColCount != _headerCols && !(row.ColCount == 3 && _headerCols == 4))
            return Bad($"wrong column count ({row.ColCount}, expected {_headerCols})");
        if (!_time.TryParse(row[0].Span, out var ticks)) return Bad("timestamp is not ISO 8601 with Z or an offset");
        Order(ticks);
        var tag = row[1].Span.Trim();
        if (!_routes.TryGetValue(tag, out var route))
        {
            _rejects.Unknown(tag);
            return false;
        }
        var quality = SampleQuality.Good;
        if (row.ColCount == 4 && !TryQuality(row[3].Span.Trim(), out quality)) return Bad("quality is not good/uncertain/bad or an OPC quality byte");
        var reason = Decode(row[2].Span, route.ValueKind, out var value);
        if (reason != RejectReason.None) return Bad($"value: {reason}");
        Current = new TagRecord(ticks, route, value, quality);
        return true;
    }

    private bool WideRow()
    {
        var row = _sep.Current;
        if (row.ColCount == 1 && row[0].Span.Trim().IsEmpty) return false;
        Rows++;
        if (row.ColCount != _headerCols) return Bad($"wrong column count ({row.ColCount}, expected {_headerCols})");
        if (!_time.TryParse(row[0].Span, out var ticks)) return Bad("timestamp is not ISO 8601 with Z or an offset");
        // A wide row is all or nothing: a bad cell rejects the row, so a truncated last line never feeds half a row.
        for (var i = 1; i < _headerCols; i++)
        {
            _wideValues[i] = double.NaN;
            var route = _wideRoutes[i];
            var cell = row[i].Span;
            if (cell.Trim().IsEmpty) continue;
            if (route is null) { _wideUnknown[i]++; continue; }
            var reason = Decode(cell, route.ValueKind, out _wideValues[i]);
            if (reason != RejectReason.None) return Bad($"{route.Tag}: {reason}");
        }
        Order(ticks);
        _rowTicks = ticks;
        _col = 1;
        _inRow = true;
        return NextWideCell();
    }

    private bool NextWideCell()
    {
        while (_col < _headerCols)
        {
            var i = _col++;
            var value = _wideValues[i];
            // Decoded values are always finite, so NaN marks an empty or unknown cell.
            if (double.IsNaN(value)) continue;
            Current = new TagRecord(_rowTicks, _wideRoutes[i]!, value, SampleQuality.Good);
            return true;
        }
        return false;
    }

    private void FlushUnknownWide()
    {
        for (var i = 1; i < _wideUnknown.Length; i++)
        {
            if (_wideUnknown[i] == 0) continue;
            _rejects.Unknown(WideNames[i], _wideUnknown[i]);
            _wideUnknown[i] = 0;
        }
    }

    private void Order(long ticks)
    {
        if (ticks < _lastRowTicks) _rejects.OutOfOrder++;
        else _lastRowTicks = ticks;
    }

    private bool Bad(string reason)
    {
        _rejects.Row(Path, _line, reason);
        return false;
    }

    private RejectReason Decode(ReadOnlySpan<char> cell, TagValueKind kind, out double value)
    {
        // A plain decimal is read from the chars directly; anything else gets the live payload rules, transcoded to UTF-8.
        if (PlainNumber.TryParse(cell, out value)) return RejectReason.None;
        if (!Encoding.UTF8.TryGetBytes(cell, _cell, out var n)) return RejectReason.TooLarge;
        var reason = PayloadDecoder.Decode(_cell.AsSpan(0, n), kind, out var decoded);
        value = decoded.Value;
        return reason;
    }

    private static bool TryQuality(ReadOnlySpan<char> s, out SampleQuality quality)
    {
        quality = SampleQuality.Good;
        if (s.IsEmpty || Is(s, "good")) return true;
        if (Is(s, "uncertain")) { quality = SampleQuality.Uncertain; return true; }
        if (Is(s, "bad")) { quality = SampleQuality.Bad; return true; }
        if (!int.TryParse(s, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var opc) || opc > 255) return false;
        // OPC DA quality byte, as the payload decoder reads it: 192+ good, 64-191 uncertain, below 64 bad (common practice, no source).
        quality = opc >= 192 ? SampleQuality.Good : opc >= 64 ? SampleQuality.Uncertain : SampleQuality.Bad;
        return true;
    }

    private static bool Is(ReadOnlySpan<char> s, string word) => s.Trim().Equals(word, StringComparison.OrdinalIgnoreCase);

    /// <inheritdoc />
    public void Dispose()
    {
        _sep?.Dispose();
        _text?.Dispose();
        _file.Dispose();
    }
}

using System.Globalization;
using System.Text;

namespace SizeTest.Catalogs.Text;

/// <summary>
/// Reads tables whose fields are separated by runs of spaces or tabs (fixed-format ASCII tables
/// as journals and archives publish them), with <c>#</c> comments and optional double quotes
/// around a field. Positions are 1-based file lines.
/// </summary>
internal sealed class WhitespaceTextReader : ICatalogReader
{
    private readonly StreamReader _reader;
    private readonly TextLayout _layout;
    private readonly HashSet<string> _nullTokens;
    private readonly string _path;
    private long _lineNo;
    private bool _headerSkipped;
    private bool _done;

    public WhitespaceTextReader(string path, TextLayout layout, ReaderOptions options)
    {
        _path = path;
        _layout = layout;
        _nullTokens = new HashSet<string>(options.NullTokens);
        _reader = new StreamReader(new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan),
            new UTF8Encoding(false), detectEncodingFromByteOrderMarks: true, bufferSize: 1 << 16);
        _headerSkipped = !layout.HeaderInFirstLine;
        RowCountHint = layout.CountRecords(path);
    }

    public CatalogFormat Format => CatalogFormat.Text;
    public string SourceName => _path;
    public string? TableName => null;
    public IReadOnlyList<string> Notes => _layout.Notes;
    public IReadOnlyList<CatalogColumn> Columns => _layout.Columns;
    public long? RowCountHint { get; }

    public bool ReadChunk(RowChunk chunk)
    {
        chunk.Reset();
        if (_done) return false;
        int nCols = _layout.Columns.Count;
        while (!chunk.IsFull)
        {
            var line = _reader.ReadLine();
            if (line is null) { _done = true; break; }
            _lineNo++;
            var t = line.AsSpan().Trim();
            if (t.IsEmpty || t[0] == '#') continue;
            if (!_headerSkipped) { _headerSkipped = true; continue; }
            var fields = TextLayout.Split(line, ' ');
            int row = chunk.BeginRow(_lineNo);
            if (fields.Length != nCols) chunk.SetRowProblem(row, $"{fields.Length} fields, the header has {nCols}");
            for (int k = 0; k < chunk.Requests.Count; k++)
            {
                var req = chunk.Requests[k];
                var buf = chunk.Columns[k];
                if (req.ColumnIndex >= fields.Length) { buf.SetNull(row); continue; }
                var f = fields[req.ColumnIndex];
                if (f.Length == 0 || _nullTokens.Contains(f)) { buf.SetNull(row); continue; }
                if (req.AsText) { buf.SetText(row, f); continue; }
                if (double.TryParse(f, NumberStyles.Float, CultureInfo.InvariantCulture, out var v)) buf.SetNumber(row, v);
                else buf.SetInvalid(row, f);
            }
        }
        return chunk.Count > 0;
    }

    public void Dispose() => _reader.Dispose();
}

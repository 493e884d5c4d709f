using System.Globalization;
using System.Text;
using CsvHelper;
using SizeTest.Common;

namespace SizeTest.Catalogs.Text;

/// <summary>
/// Reads CSV, TSV and other single-character-delimited text with CsvHelper 34 (RFC 4180 quoting,
/// <c>#</c> comment lines, header row, empty cells and null tokens as null). Positions are the
/// file lines where records start.
/// </summary>
internal sealed class DelimitedTextReader : ICatalogReader
{
    private readonly CsvReader _csv;
    private readonly TextLayout _layout;
    private readonly byte[][] _nullTokens;
    private readonly int _fieldCount;
    private readonly string _path;
    private bool _done;

    public DelimitedTextReader(string path, TextLayout layout, ReaderOptions options)
    {
        _path = path;
        _layout = layout;
        _fieldCount = layout.Columns.Count;
        _nullTokens = options.NullTokens.Select(t => Encoding.UTF8.GetBytes(t)).ToArray();
        var csvOptions = new CsvReaderOptions
        {
            Separator = layout.Delimiter,
            HasHeader = layout.HeaderInFirstLine,
            CommentPrefix = '#',
            TrackLineNumbers = true,
            TrimWhitespace = true,
            SkipEmptyLines = true,
            MaxRecordSize = 16 << 20,
            DetectSeparatorHint = false,
        };
        try
        {
            _csv = CsvReader.FromFile(path, csvOptions);
        }
        catch (CsvFormatException ex)
        {
            throw new InputException($"cannot read the text table: {ex.Message}", path, ex.LineNumber > 0 ? ex.LineNumber : null, inner: ex);
        }
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
        var requests = chunk.Requests;
        var buffers = chunk.Columns;
        try
        {
            while (!chunk.IsFull)
            {
                if (!_csv.Read()) { _done = true; break; }
                int fc = _csv.FieldCount;
                if (fc <= 1 && _fieldCount > 1 && _csv.RawRecord.Trim(" \t\r"u8).IsEmpty) continue; // a blank line (spaces only) is no row
                int row = chunk.BeginRow(_csv.LineNumber);
                if (fc != _fieldCount)
                    chunk.SetRowProblem(row, $"{fc} fields, the header has {_fieldCount}");
                for (int k = 0; k < requests.Count; k++)
                {
                    var req = requests[k];
                    var buf = buffers[k];
                    if (req.ColumnIndex >= fc) { buf.SetNull(row); continue; }
                    var span = _csv.GetSpan(req.ColumnIndex);
                    if (IsNull(span)) { buf.SetNull(row); continue; }
                    if (req.AsText) { buf.SetText(row, Encoding.UTF8.GetString(span)); continue; }
                    if (FastDecimal.TryParse(span, out var v)) buf.SetNumber(row, v);
                    else buf.SetInvalid(row, Encoding.UTF8.GetString(span));
                }
            }
        }
        catch (CsvFormatException ex)
        {
            throw new InputException($"cannot read the text table: {ex.Message}", _path, ex.LineNumber > 0 ? ex.LineNumber : null, inner: ex);
        }
        return chunk.Count > 0;
    }

    private bool IsNull(ReadOnlySpan<byte> span)
    {
        if (span.IsEmpty) return true;
        foreach (var t in _nullTokens) if (span.SequenceEqual(t)) return true;
        return false;
    }

    public void Dispose() => _csv.Dispose();
}

using CsvHelper;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// Reads CSV, TSV and other single-character-delimited text with CsvHelper 34 (RFC 4180 quoting,
/// <c>#</c> comment lines, header row, empty cells and null tokens as null). Positions are the
/// file lines where records start.
/// </summary>
internal sealed class DelimitedTextReader : TextTableReader
{
    private readonly CsvReader _csv;
    private readonly int _fieldCount;

    public DelimitedTextReader(string path, TextLayout layout, ReaderOptions options) : base(path, layout, options)
    {
        _fieldCount = layout.Columns.Count;
        var csvOptions = new CsvReaderOptions
        {
            Separator = layout.Delimiter,
            HasHeader = layout.HeaderInFirstLine,
            CommentPrefix = '#',
            TrackLineNumbers = true,
            TrimWhitespace = true,
            SkipEmptyLines = true,
            MaxRecordSize = options.MaxLineBytes,
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
    }

    protected override bool NextRecord(out long line, out int fieldCount)
    {
        try
        {
            while (_csv.Read())
            {
                int fc = _csv.FieldCount;
                if (fc <= 1 && _fieldCount > 1 && _csv.RawRecord.Trim(" \t\r"u8).IsEmpty) continue; // a blank line (spaces only) is no row
                if (Layout.SkippedLines.Contains(_csv.LineNumber)) continue;                              // units or a rule under the header
                (line, fieldCount) = (_csv.LineNumber, fc);
                return true;
            }
        }
        catch (CsvFormatException ex)
        {
            throw new InputException($"cannot read the text table: {ex.Message}", Path, ex.LineNumber > 0 ? ex.LineNumber : null, inner: ex);
        }
        (line, fieldCount) = (0, 0);
        return false;
    }

    protected override bool FieldIsEmpty(int index) => _csv.GetSpan(index).IsEmpty;

    protected override void DecodeField(int index, ColumnBuffer buffer, bool asText, int row) => Cells.Decode(_csv.GetSpan(index), buffer, asText, row);

    public override void Dispose() => _csv.Dispose();
}

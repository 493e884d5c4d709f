using System.Text;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// Reads tables whose fields are separated by runs of spaces or tabs (fixed-format ASCII tables
/// as journals and archives publish them), with <c>#</c> comments and optional double quotes
/// around a field. Positions are 1-based file lines.
/// </summary>
internal sealed class WhitespaceTextReader : TextTableReader
{
    private readonly StreamReader _reader;
    private long _lineNo;
    private bool _headerSkipped;
    private string[] _fields = [];

    public WhitespaceTextReader(string path, TextLayout layout, ReaderOptions options) : base(path, layout, options)
    {
        _reader = new StreamReader(SizeTest.Foundation.Files.LineCappedStream.Open(path, options.MaxLineBytes),
            new UTF8Encoding(false), detectEncodingFromByteOrderMarks: true, bufferSize: 1 << 16);
        _headerSkipped = !layout.HeaderInFirstLine;
    }

    protected override bool NextRecord(out long line, out int fieldCount)
    {
        while (_reader.ReadLine() is { } text)
        {
            _lineNo++;
            var t = text.AsSpan().Trim();
            if (t.IsEmpty || t[0] == '#') continue;
            if (!_headerSkipped) { _headerSkipped = true; continue; }
            if (Layout.SkippedLines.Contains(_lineNo)) continue;   // units or a rule under the header
            _fields = TextLayout.Split(text, ' ');
            (line, fieldCount) = (_lineNo, _fields.Length);
            return true;
        }
        (line, fieldCount) = (_lineNo, 0);
        return false;
    }

    protected override bool FieldIsEmpty(int index) => _fields[index].Length == 0;

    protected override void DecodeField(int index, ColumnBuffer buffer, bool asText, int row) => Cells.Decode(_fields[index], buffer, asText, row);

    public override void Dispose() => _reader.Dispose();
}

using System.Text;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// Reads IPAC tables (IRSA's "IPAC ASCII column-aligned format", version 1.2 of 2013), the text tables of the NASA/IPAC
/// archives: <c>\keyword = value</c> and <c>\ comment</c> lines, then one to four header lines between <c>|</c> bars —
/// column names, data types (<c>integer long double float real char date</c> or a prefix of one, tried in that order), units, null values — then
/// data lines whose values lie between the positions of the bars. A cell is null when it is blank, equals the column's
/// null value or is a text null token. A line with a character under a bar, or beyond the last one, is not aligned with
/// the header and becomes a row problem (the row is rejected), never a value cut at the bar. Positions are file lines.
/// </summary>
internal sealed class IpacTableReader : TextTableReader
{
    private readonly StreamReader _reader;
    private readonly int[] _bars;          // character positions of the '|' in the names line
    private readonly string?[] _nulls;     // each column's null value (4th header line), or null
    private readonly long _firstDataLine;
    private readonly string[] _names;
    private long _lineNo;
    private string _line = "";

    private IpacTableReader(string path, TextLayout layout, ReaderOptions options, int[] bars, string?[] nulls, long firstDataLine)
        : base(path, layout, options)
    {
        _bars = bars;
        _nulls = nulls;
        _firstDataLine = firstDataLine;
        _names = [.. layout.Columns.Select(c => c.Name)];
        _reader = new StreamReader(LineCappedStream.Open(path, options.MaxLineBytes), new UTF8Encoding(false), detectEncodingFromByteOrderMarks: true, bufferSize: 1 << 16);
    }

    /// <summary>Whether <paramref name="path"/> reads as an IPAC table: after optional blank and <c>\</c> lines, a line that
    /// begins and ends with <c>|</c>, and a first data line (if any) that does not begin with <c>|</c> (a table whose every
    /// line is between bars is bar-delimited text, unless it is at most four such lines whose second names IPAC types).</summary>
    public static bool Looks(string path, ReaderOptions options)
    {
        using var sr = new StreamReader(LineCappedStream.Open(path, options.MaxLineBytes), new UTF8Encoding(false), detectEncodingFromByteOrderMarks: true);
        var bars = new List<string>();
        for (int n = 0; n < 400 && sr.ReadLine() is { } line; n++)
        {
            var t = line.Trim();
            if (t.Length == 0 || (bars.Count == 0 && t[0] == '\\')) continue;
            if (t[0] == '|') { if (t.Length < 2 || t[^1] != '|') return false; bars.Add(t); continue; }
            return bars.Count > 0;
        }
        // Only lines between bars: an IPAC header without rows, or a bar-delimited table.
        return bars.Count == 1 || (bars.Count is > 1 and <= 4 && bars[1].Trim('|').Split('|').All(c => c.Trim(' ', '-') is var x && (x.Length == 0 || IsType(x))));
    }

    private static bool IsType(string type)
    {
        var t = type.ToLowerInvariant();
        return new[] { "integer", "long", "double", "float", "real", "char", "date" }.Any(full => full.StartsWith(t, StringComparison.Ordinal));
    }

    /// <summary>Reads the header of <paramref name="path"/> and opens the reader. Throws <see cref="InputException"/> naming
    /// the line for a header that is not an IPAC header (more than four bar lines, lines with different numbers of columns,
    /// an unknown data type).</summary>
    public static IpacTableReader Open(string path, ReaderOptions options)
    {
        var headers = new List<(long No, string Text)>();
        var skipped = new HashSet<long>();
        var sample = new List<string>();
        long no = 0, firstData = 0;
        int keywords = 0;
        using (var sr = new StreamReader(LineCappedStream.Open(path, options.MaxLineBytes), new UTF8Encoding(false), detectEncodingFromByteOrderMarks: true))
        {
            while (sr.ReadLine() is { } line)
            {
                no++;
                var t = line.TrimEnd();
                if (t.Trim().Length == 0) continue;
                if (firstData == 0 && headers.Count == 0 && t.TrimStart()[0] == '\\') { skipped.Add(no); keywords++; continue; }
                if (firstData == 0 && t.TrimStart()[0] == '|')
                {
                    if (headers.Count == 4)
                        throw new InputException("an IPAC table has at most four header lines between '|' (names, types, units, nulls); this is a fifth", path, no);
                    headers.Add((no, t));
                    skipped.Add(no);
                    continue;
                }
                if (firstData == 0) firstData = no;
                sample.Add(line);
                if (sample.Count >= 200) break;
            }
        }
        if (headers.Count == 0) throw new InputException("an IPAC table needs a header line of column names between '|'", path);

        var (namesNo, namesLine) = headers[0];
        int first = namesLine.IndexOf('|');
        var bars = new List<int>();
        for (int i = first; i < namesLine.Length; i++) if (namesLine[i] == '|') bars.Add(i);
        int count = bars.Count - 1;
        if (count < 1 || namesLine[^1] != '|')
            throw new InputException("the IPAC column-name line must begin and end with '|'", path, namesNo);
        if (count > options.MaxColumns)
            throw new InputException($"the line has more than {options.MaxColumns} columns; a catalogue has at most {options.MaxColumns} columns", path, namesNo);
        string[] Cells(string line) => [.. line.Trim().Trim('|').Split('|').Select(s => s.Trim())];
        var lines = headers.Select(h => Cells(h.Text)).ToArray();
        for (int k = 1; k < lines.Length; k++)
            if (lines[k].Length != count)
                throw new InputException($"this IPAC header line has {lines[k].Length} columns between '|', the names line {count}; the bars must align", path, headers[k].No);

        var nulls = new string?[count];
        var columns = new List<CatalogueColumn>();
        var seen = new UniqueColumnNames();
        for (int i = 0; i < count; i++)
        {
            var name = lines[0][i].Trim(' ', '-');
            if (name.Length == 0) name = $"col{i + 1}";
            string type = lines.Length > 1 ? lines[1][i].Trim(' ', '-') : "";
            ColumnKind kind = type.Length == 0 ? SampledKind(sample, bars, i, options) : Kind(type, path, headers[1].No, name);
            string? unit = lines.Length > 2 && lines[2][i].Length > 0 ? lines[2][i] : null;
            nulls[i] = lines.Length > 3 && lines[3][i].Length > 0 ? lines[3][i] : null;
            columns.Add(new CatalogueColumn(seen.Take(name, i + 1), kind, unit, null, null, type.Length == 0 ? (kind == ColumnKind.Text ? "text" : "number") : type));
        }
        var notes = new List<string>
        {
            $"layout: IPAC table; {headers.Count} header line{(headers.Count == 1 ? "" : "s")} between '|' (line{(headers.Count == 1 ? "" : "s")} {string.Join(", ", headers.Select(h => h.No))}: "
                + string.Join(", ", new[] { "names", "types", "units", "nulls" }.Take(headers.Count)) + ")"
                + (keywords > 0 ? $", {keywords} keyword/comment line{(keywords == 1 ? "" : "s")}" : ""),
        };
        if (seen.Warning() is { } renamed) notes.Add(renamed);
        var layout = new TextLayout
        {
            Delimiter = '|',
            HeaderInFirstLine = false,
            HeaderLine = namesNo,
            HeaderFromComment = false,
            Columns = columns,
            Notes = notes,
            SkippedLines = skipped,
        };
        return new IpacTableReader(path, layout, options, [.. bars], nulls, firstData == 0 ? long.MaxValue : firstData);
    }

    // IPAC data types, each also by a prefix, tried in the standard's order so that "d" is double and "da" date:
    // integer/int and long are integers; double, float and real numbers; char and date text.
    private static ColumnKind Kind(string type, string path, long line, string column)
    {
        var t = type.ToLowerInvariant();
        bool Is(string full) => full.StartsWith(t, StringComparison.Ordinal);
        if (Is("integer") || Is("long")) return ColumnKind.Integer;
        if (Is("double") || Is("float") || Is("real")) return ColumnKind.Real;
        if (Is("char") || Is("date")) return ColumnKind.Text;
        throw new InputException($"unknown IPAC data type '{type}'; the types are integer (int), long, double, float, real, char and date, or a prefix of one", path, line, column);
    }

    // Without a types line a column is a number when every sampled cell of it is a number or null.
    private static ColumnKind SampledKind(List<string> sample, List<int> bars, int i, ReaderOptions options) =>
        sample.All(l => Slice(l, bars[i], bars[i + 1]) is var c && (c.Length == 0 || options.NullTokens.Contains(c) || TextLayout.IsNumber(c)))
            ? ColumnKind.Real : ColumnKind.Text;

    private static string Slice(string line, int leftBar, int rightBar)
    {
        int start = leftBar + 1, end = Math.Min(rightBar, line.Length);
        return start >= end ? "" : line[start..end].Trim();
    }

    protected override bool NextRecord(out long line, out int fieldCount)
    {
        while (_reader.ReadLine() is { } text)
        {
            _lineNo++;
            if (_lineNo < _firstDataLine || text.Trim().Length == 0) continue;
            _line = text;
            (line, fieldCount) = (_lineNo, _names.Length);
            return true;
        }
        (line, fieldCount) = (_lineNo, 0);
        return false;
    }

    protected override string? RecordProblem()
    {
        for (int k = 0; k < _bars.Length; k++)
        {
            int b = _bars[k];
            if (b >= _line.Length) break;
            if (char.IsWhiteSpace(_line[b])) continue;
            string where = k == 0 ? $"before column '{_names[0]}'" : k == _bars.Length - 1 ? $"after column '{_names[^1]}'" : $"between columns '{_names[k - 1]}' and '{_names[k]}'";
            return $"character {b + 1} lies under a '|' of the header ({where}): the line is not aligned with the columns";
        }
        int last = _bars[^1];
        if (_line.Length > last + 1 && _line[(last + 1)..].Trim().Length > 0)
            return $"text after the last column '{_names[^1]}' (beyond character {last + 1}): the line is not aligned with the columns";
        return null;
    }

    protected override bool FieldIsEmpty(int index) => Slice(_line, _bars[index], _bars[index + 1]).Length == 0;

    protected override void DecodeField(int index, ColumnBuffer buffer, bool asText, int row)
    {
        var cell = Slice(_line, _bars[index], _bars[index + 1]);
        if (_nulls[index] is { } n && cell == n) buffer.SetNull(row);
        else Cells.Decode(cell, buffer, asText, row);
    }

    public override void Dispose() => _reader.Dispose();
}

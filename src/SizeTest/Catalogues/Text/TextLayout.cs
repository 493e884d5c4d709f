using System.Globalization;
using System.Text;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;

namespace SizeTest.Catalogues.Text;

/// <summary>
/// The layout of a delimited text catalogue found by looking at its first lines: the
/// delimiter, where the header is (first line, a last comment line, or none) and the column
/// kinds and units (<c>name [unit]</c> in the header).
/// </summary>
internal sealed class TextLayout
{
    public required char Delimiter { get; init; }          // ' ' = runs of whitespace
    public required bool HeaderInFirstLine { get; init; }
    public required long? HeaderLine { get; init; }        // 1-based line of the header (first line or comment), null = none
    public required bool HeaderFromComment { get; init; }
    public required IReadOnlyList<CatalogueColumn> Columns { get; init; }
    public required IReadOnlyList<string> Notes { get; init; }
    public IReadOnlySet<long> SkippedLines { get; init; } = new HashSet<long>();   // 1-based lines under the header that are no rows (units, a rule)

    public static TextLayout Detect(string path, ReaderOptions options)
    {
        var lines = new List<(long No, string Text)>();
        using (var fs = SizeTest.Foundation.Files.LineCappedStream.Open(path, options.MaxLineBytes))
        using (var sr = new StreamReader(fs, new UTF8Encoding(false), detectEncodingFromByteOrderMarks: true))
        {
            long no = 0;
            int chars = 0;
            string? line;
            while ((line = sr.ReadLine()) is not null && lines.Count < 400 && chars < (1 << 20))
            {
                no++;
                chars += line.Length;
                lines.Add((no, line));
            }
        }
        string? lastComment = null;
        long lastCommentNo = 0;
        var data = new List<(long No, string Text)>();
        foreach (var (no, text) in lines)
        {
            var t = text.TrimStart();
            if (t.Length == 0) continue;
            if (t[0] == '#')
            {
                if (data.Count == 0) { lastComment = t[1..]; lastCommentNo = no; }
                continue;
            }
            data.Add((no, text));
        }
        if (data.Count == 0)
            throw new InputException("the file has no data lines (only comments or nothing); is it a catalogue?", path);

        var notes = new List<string>();
        int maxColumns = options.MaxColumns;
        char delim = options.Delimiter ?? DetectDelimiter(path, data[0].Text, maxColumns);
        notes.Add(delim switch
        {
            ' ' => "delimiter: runs of spaces/tabs",
            '\t' => "delimiter: tab",
            _ => $"delimiter: '{delim}'",
        } + (options.Delimiter is null ? " (detected)" : " (given)"));

        // Splitting stops one field past the cap, so a header of 500 000 one-letter names costs 10 001 strings, not 500 000.
        var first = Split(data[0].Text, delim, maxColumns);
        if (first.Length > maxColumns)
            throw new InputException($"the line has more than {maxColumns} fields; a catalogue has at most {maxColumns} columns (is this a catalogue? check the delimiter, or drop unused columns)", path, data[0].No);
        bool headerFirst, fromComment = false;
        string[] names;
        long? headerLine = null;
        if (options.HasHeader is bool h)
        {
            headerFirst = h;
        }
        else
        {
            // A header names every column: no field of it is a number (a data line with a text id has numbers beside it).
            headerFirst = first.Any(f => f.Length > 0) && first.All(f => f.Length == 0 || !IsNumber(f));
        }
        if (headerFirst)
        {
            names = first;
            headerLine = data[0].No;
            data.RemoveAt(0);
            notes.Add($"header: line {headerLine}" + (options.HasHeader is null ? " (detected: no field is a number)" : " (given)"));
        }
        else if (options.HasHeader is null && lastComment is not null
                 && Split(lastComment.Trim(), delim, maxColumns) is { } cnames && cnames.Length == first.Length && cnames.All(f => f.Length > 0 && !IsNumber(f)))
        {
            names = cnames;
            headerLine = lastCommentNo;
            fromComment = true;
            notes.Add($"header: comment line {lastCommentNo} (the first data line is all numbers and this comment names one column per field)");
        }
        else
        {
            names = Enumerable.Range(1, first.Length).Select(i => $"col{i}").ToArray();
            notes.Add("header: none; columns are named col1, col2, …");
        }

        var skipped = new HashSet<long>();
        var lineUnits = headerFirst ? UnitsAndRule(data, names.Length, delim, maxColumns, skipped, notes) : null;

        var nulls = new HashSet<string>(options.NullTokens) { "" };
        var columns = new List<CatalogueColumn>();
        var seen = new UniqueColumnNames();
        // Kinds are judged on the first lines: 200 of them, fewer for wide tables (at most ~200 000 cells are split).
        var sampleCells = data.Take(Math.Clamp(200_000 / Math.Max(1, names.Length), 2, 200)).Select(d => Split(d.Text, delim, maxColumns)).ToList();
        // A header line ending with the delimiter ("z,theta,") has an empty field after its last name: no column, when no
        // sampled line has a value there (each line ends one field earlier, or with the delimiter too).
        if (headerFirst && delim != ' ' && names.Length > 1 && names[^1].Trim().Length == 0
            && sampleCells.All(f => f.Length < names.Length || f[names.Length - 1].Length == 0))
        {
            names = names[..^1];
            notes.Add($"header: line {headerLine} ends with the delimiter; the empty field after its last name is no column");
        }
        if (sampleCells.Count > 0 && delim != ' ' && sampleCells[0].Length == names.Length + 1 && sampleCells[0][^1].Length == 0)
            notes.Add("data lines end with the delimiter; the empty field after the last column is ignored");
        for (int i = 0; i < names.Length; i++)
        {
            var (name, unit) = SplitUnit(names[i].Trim());
            if (unit is null && lineUnits is not null && i < lineUnits.Length && lineUnits[i].Length > 0) unit = lineUnits[i];
            if (name.Length == 0) name = $"col{i + 1}";
            var unique = seen.Take(name, i + 1);
            bool numeric = true;
            foreach (var f in sampleCells)
            {
                if (i < f.Length && !nulls.Contains(f[i]) && !IsNumber(f[i])) { numeric = false; break; }
            }
            columns.Add(new CatalogueColumn(unique, numeric ? ColumnKind.Real : ColumnKind.Text, unit, null, null, numeric ? "number" : "text"));
        }
        if (seen.Warning() is { } renamed) notes.Add(renamed);
        return new TextLayout
        {
            Delimiter = delim,
            HeaderInFirstLine = headerFirst,
            HeaderLine = headerLine,
            HeaderFromComment = fromComment,
            Columns = columns,
            Notes = notes,
            SkippedLines = skipped,
        };
    }

    /// <summary>
    /// The lines archives put under a header (a VizieR tab-separated download: a line of units, then a rule of dashes):
    /// removed from <paramref name="data"/> into <paramref name="skipped"/>, so they are neither rows nor evidence of a
    /// text column. A line with no number in it is a units line when a rule follows it, or when every field in it is a
    /// unit SizeTest reads; it returns those units (one per column, empty where none), or null.
    /// </summary>
    private static string[]? UnitsAndRule(List<(long No, string Text)> data, int columns, char delim, int maxColumns, HashSet<long> skipped, List<string> notes)
    {
        string[] Fields(int k) => Split(data[k].Text, delim, maxColumns).Select(f => f.Trim()).ToArray();
        static bool IsRule(string[] f) => f.Any(x => x.Length > 0) && f.All(x => x.Length == 0 || x.All(c => c is '-' or '='));
        if (data.Count == 0) return null;
        string[]? units = null;
        int k = 0;
        var next = Fields(0);
        bool ruleAfter = data.Count > 1 && IsRule(Fields(1));
        bool aligned = delim == ' ' ? next.Length == columns : next.Length <= columns;   // blanks collapse between spaced fields
        if (!IsRule(next) && aligned && next.Any(f => f.Length > 0) && next.All(f => f.Length == 0 || !IsNumber(f))
            && (ruleAfter || next.All(f => f.Length == 0 || IsUnitWord(f))))
        {
            units = next;
            skipped.Add(data[0].No);
            notes.Add($"units: line {data[0].No} (a line of units under the header)");
            k = 1;
        }
        if (data.Count > k && IsRule(Fields(k)))
        {
            skipped.Add(data[k].No);
            notes.Add($"line {data[k].No}: a rule of dashes under the header, skipped");
            k++;
        }
        data.RemoveRange(0, k);
        return units;
    }

    private static char DetectDelimiter(string path, string line, int maxColumns)
    {
        var ext = Path.GetExtension(path).ToLowerInvariant();
        if (ext is ".tsv" or ".tab") return '\t';
        char best = ' ';
        int bestCount = 0;
        foreach (var c in ",\t;|")
        {
            int n = Split(line, c, maxColumns).Length - 1;
            if (n > bestCount) { best = c; bestCount = n; }
        }
        if (bestCount > 0) return best;
        return ext == ".csv" ? ',' : ' ';
    }

    /// <summary>Splits one line (double quotes protect delimiters; <c>""</c> is a quote), stopping after
    /// <paramref name="maxFields"/> + 1 fields: a longer result means the line has more than <paramref name="maxFields"/>.</summary>
    public static string[] Split(string line, char delim, int maxFields = int.MaxValue)
    {
        var fields = new List<string>();
        var sb = new StringBuilder();
        int i = 0, n = line.Length;
        if (delim == ' ')
        {
            while (true)
            {
                while (i < n && (line[i] == ' ' || line[i] == '\t')) i++;
                if (i >= n) break;
                sb.Clear();
                if (line[i] == '"')
                {
                    i++;
                    while (i < n)
                    {
                        if (line[i] == '"') { if (i + 1 < n && line[i + 1] == '"') { sb.Append('"'); i += 2; continue; } i++; break; }
                        sb.Append(line[i++]);
                    }
                    while (i < n && line[i] != ' ' && line[i] != '\t') sb.Append(line[i++]);
                }
                else
                {
                    while (i < n && line[i] != ' ' && line[i] != '\t') sb.Append(line[i++]);
                }
                fields.Add(sb.ToString());
                if (fields.Count > maxFields) break;
            }
            return fields.ToArray();
        }
        while (true)
        {
            sb.Clear();
            while (i < n && (line[i] == ' ' || line[i] == '\t') && line[i] != delim) i++;
            if (i < n && line[i] == '"')
            {
                i++;
                while (i < n)
                {
                    if (line[i] == '"') { if (i + 1 < n && line[i + 1] == '"') { sb.Append('"'); i += 2; continue; } i++; break; }
                    sb.Append(line[i++]);
                }
                while (i < n && line[i] != delim) sb.Append(line[i++]);
            }
            else
            {
                while (i < n && line[i] != delim) sb.Append(line[i++]);
            }
            fields.Add(sb.ToString().Trim());
            if (i >= n || fields.Count > maxFields) break;
            i++; // delimiter
        }
        return fields.ToArray();
    }

    public static bool IsNumber(string s) => double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out _);

    /// <summary>Splits <c>name [unit]</c> into name and unit; also <c>name (unit)</c> when the parenthesised text is a unit
    /// SizeTest reads (an angle, mag/arcsec², a magnitude system, a relative error, or a length in pc/kpc/Mpc), so that
    /// <c>Re (mas)</c> is column Re in mas while <c>mag(r)</c>, a band, keeps its name.</summary>
    public static (string Name, string? Unit) SplitUnit(string header)
    {
        if (header.EndsWith(']'))
        {
            int open = header.LastIndexOf('[');
            if (open > 0)
            {
                var unit = header[(open + 1)..^1].Trim();
                return (header[..open].Trim(), unit.Length == 0 ? null : unit);
            }
        }
        if (header.EndsWith(')') && MatchingOpen(header) is int po and > 0)
        {
            var unit = header[(po + 1)..^1].Trim();
            var name = header[..po].Trim();
            if (name.Length > 0 && IsUnitWord(unit)) return (name, unit);
        }
        return (header, null);
    }

    // The index of the '(' that the final ')' closes, or -1.
    private static int MatchingOpen(string s)
    {
        int depth = 0;
        for (int i = s.Length - 1; i >= 0; i--)
        {
            if (s[i] == ')') depth++;
            else if (s[i] == '(' && --depth == 0) return i;
        }
        return -1;
    }

    private static bool IsUnitWord(string unit) =>
        unit.Length > 0 && unit != "sec"
        && (CatalogueUnits.TryParseAngle(unit, out _, out _) || CatalogueUnits.IsSurfaceBrightness(unit) || CatalogueUnits.IsMagnitude(unit)
            || CatalogueUnits.TryParseRelative(unit, out _) || unit.ToLowerInvariant() is "pc" or "kpc" or "mpc" or "kpc/h" or "mpc/h");

    /// <summary>
    /// Counts lines that are neither empty nor comments: an upper bound on the data records
    /// (quoted line breaks make it an overestimate), minus the header line.
    /// </summary>
    public long CountRecords(string path)
    {
        long count = 0;
        var buf = new byte[1 << 20];
        using var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan);
        bool atLineStart = true, lineHasContent = false, lineIsComment = false;
        int read;
        while ((read = fs.Read(buf, 0, buf.Length)) > 0)
        {
            var span = buf.AsSpan(0, read);
            while (span.Length > 0)
            {
                if (atLineStart)
                {
                    // Decide the line's kind from its first non-blank byte.
                    int k = 0;
                    while (k < span.Length && (span[k] == (byte)' ' || span[k] == (byte)'\t' || span[k] == (byte)'\r')) k++;
                    if (k == span.Length) { span = default; break; }
                    atLineStart = false;
                    lineIsComment = span[k] == (byte)'#';
                    lineHasContent = span[k] != (byte)'\n';
                    if (span[k] == (byte)'\n') { atLineStart = true; span = span[(k + 1)..]; continue; }
                }
                int nl = span.IndexOf((byte)'\n');
                if (nl < 0) { span = default; break; }
                if (lineHasContent && !lineIsComment) count++;
                atLineStart = true;
                lineHasContent = false;
                span = span[(nl + 1)..];
            }
        }
        if (!atLineStart && lineHasContent && !lineIsComment) count++;
        if (HeaderInFirstLine) count--;
        count -= SkippedLines.Count;
        return Math.Max(0, count);
    }
}

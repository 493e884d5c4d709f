using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Photometry;

/// <summary>
/// Parses already-read text of a plain two-column table (spectra, filter curves, band
/// tables): one row per line, fields separated by white space or commas, '#' starts a
/// comment, blank lines ignored, one optional non-numeric header line. Further fields on
/// a row are ignored. No I/O: the caller reads the file.
/// </summary>
public static class TwoColumnText
{
    /// <summary>The parsed table.</summary>
    /// <param name="First">First column.</param>
    /// <param name="Second">Second column.</param>
    /// <param name="Lines">1-based source line of each row.</param>
    /// <param name="Comments">Comment lines (without '#'), e.g. a citation to keep with the table.</param>
    public sealed record Table(double[] First, double[] Second, long[] Lines, IReadOnlyList<string> Comments);

    /// <summary>Parses two numeric columns.</summary>
    /// <exception cref="InputException">A row is malformed (names <paramref name="source"/> and the line).</exception>
    public static Table ParseNumeric(string text, string source)
    {
        var a = new List<double>();
        var b = new List<double>();
        var lines = new List<long>();
        var comments = new List<string>();
        bool headerAllowed = true;
        foreach (var (line, no) in Lines(text, comments))
        {
            var f = Split(line);
            if (f.Length < 2)
                throw new InputException($"expected two columns (wavelength and value), found {f.Length}.", source, no);
            bool okA = TryNumber(f[0], out double x), okB = TryNumber(f[1], out double y);
            if (!okA || !okB)
            {
                if (headerAllowed && !okA) { headerAllowed = false; continue; }
                throw new InputException($"'{(okA ? f[1] : f[0])}' is not a number.", source, no, okA ? "2" : "1");
            }
            headerAllowed = false;
            a.Add(x);
            b.Add(y);
            lines.Add(no);
        }
        if (a.Count == 0) throw new InputException("the table has no data rows.", source);
        return new Table(a.ToArray(), b.ToArray(), lines.ToArray(), comments);
    }

    /// <summary>
    /// Parses a band table: a band name and a number per row (zero points, extinction
    /// coefficients). The returned table's source is the file name plus its first comment line.
    /// </summary>
    /// <exception cref="InputException">A row is malformed or a band is listed twice.</exception>
    public static BandTable ParseBandTable(string text, string source, string quantity)
    {
        var values = new Dictionary<string, double>(StringComparer.Ordinal);
        var comments = new List<string>();
        bool headerAllowed = true;
        foreach (var (line, no) in Lines(text, comments))
        {
            var f = Split(line);
            if (f.Length < 2)
                throw new InputException($"expected a band name and a {quantity}, found {f.Length} field(s).", source, no);
            if (!TryNumber(f[1], out double v))
            {
                if (headerAllowed) { headerAllowed = false; continue; }
                throw new InputException($"'{f[1]}' is not a number.", source, no, "2");
            }
            headerAllowed = false;
            if (!values.TryAdd(f[0], v))
                throw new InputException($"band '{f[0]}' is listed twice.", source, no, "1");
        }
        if (values.Count == 0) throw new InputException($"the {quantity} table has no rows.", source);
        string src = comments.Count > 0 ? $"{source} ({comments[0].Trim()})" : source;
        return new BandTable(values, src, quantity);
    }

    private static IEnumerable<(string Line, long No)> Lines(string text, List<string> comments)
    {
        long no = 0;
        using var reader = new StringReader(text ?? "");
        while (reader.ReadLine() is { } raw)
        {
            no++;
            int hash = raw.IndexOf('#');
            if (hash >= 0)
            {
                var c = raw[(hash + 1)..].Trim();
                if (c.Length > 0) comments.Add(c);
                raw = raw[..hash];
            }
            if (raw.Trim().Length == 0) continue;
            yield return (raw, no);
        }
    }

    private static string[] Split(string line) =>
        line.Split([' ', '\t', ',', ';'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);

    private static bool TryNumber(string s, out double v) =>
        double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out v) && double.IsFinite(v);
}

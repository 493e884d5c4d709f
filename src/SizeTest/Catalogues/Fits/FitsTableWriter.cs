using System.Buffers.Binary;
using System.Globalization;
using System.Text;
using SizeTest.Foundation.Files;

namespace SizeTest.Catalogues.Fits;

/// <summary>
/// Writes <see cref="CatalogueTable"/>s as a FITS file (FITS Standard 4.0): an empty primary HDU
/// followed by one BINTABLE extension per table. Reals are TFORM <c>1D</c> (NaN = null), integers
/// <c>1K</c>, text <c>nA</c> (n = longest value, blanks = null); TTYPEn, TUNITn, EXTNAME, and the
/// UCD as the non-standard TUCDn keyword (SizeTest's reader uses it; other readers ignore it).
/// Streams rows, so a mock catalogue of 10⁷ rows needs no extra copy. Written atomically.
/// </summary>
public static class FitsTableWriter
{
    /// <summary>Writes one or more tables to <paramref name="path"/> (replacing it; callers check <c>--force</c>).</summary>
    public static void Write(string path, params CatalogueTable[] tables)
    {
        ArgumentNullException.ThrowIfNull(tables);
        if (tables.Length == 0) throw new ArgumentException("at least one table is needed", nameof(tables));
        AtomicFile.Write(path, stream =>
        {
            var bs = new BufferedStream(stream, 1 << 20); // not disposed: that would close the target stream before AtomicFile flushes it
            var primary = new List<string> { Logical("SIMPLE", true, "conforms to FITS Standard 4.0"), Integer("BITPIX", 8), Integer("NAXIS", 0), Logical("EXTEND", true) };
            WriteHeader(bs, primary);
            foreach (var t in tables) WriteTable(bs, t);
            bs.Flush();
        });
    }

    private static void WriteTable(Stream s, CatalogueTable table)
    {
        var cols = table.Columns;
        var widths = new int[cols.Count];
        var forms = new string[cols.Count];
        for (int k = 0; k < cols.Count; k++)
        {
            var c = cols[k];
            if (c.Reals is not null) { widths[k] = 8; forms[k] = "1D"; }
            else if (c.Integers is not null) { widths[k] = 8; forms[k] = "1K"; }
            else
            {
                int w = Math.Max(1, c.Texts!.Max(x => x is null ? 0 : Encoding.ASCII.GetByteCount(x)));
                widths[k] = w;
                forms[k] = $"{w}A";
            }
        }
        int rowBytes = widths.Sum();
        var h = new List<string>
        {
            Str("XTENSION", "BINTABLE", "binary table extension"), Integer("BITPIX", 8), Integer("NAXIS", 2),
            Integer("NAXIS1", rowBytes, "bytes per row"), Integer("NAXIS2", table.RowCount, "rows"),
            Integer("PCOUNT", 0), Integer("GCOUNT", 1), Integer("TFIELDS", cols.Count),
        };
        for (int k = 0; k < cols.Count; k++)
        {
            var c = cols[k];
            int n = k + 1;
            if (c.Name.Length > 68 || c.Name.Any(ch => ch is < ' ' or > '~'))
                throw new ArgumentException($"column name '{c.Name}' must be printable ASCII of at most 68 characters for FITS");
            h.Add(Str($"TTYPE{n}", c.Name, Clip(c.Description)));
            h.Add(Str($"TFORM{n}", forms[k]));
            if (!string.IsNullOrEmpty(c.Unit)) h.Add(Str($"TUNIT{n}", Clip(c.Unit)!));
            if (!string.IsNullOrEmpty(c.Ucd)) h.Add(Str($"TUCD{n}", Clip(c.Ucd)!));
        }
        if (!string.IsNullOrEmpty(table.Name)) h.Add(Str("EXTNAME", Clip(table.Name)!));
        WriteHeader(s, h);

        var row = new byte[Math.Max(1, rowBytes)];
        for (int r = 0; r < table.RowCount; r++)
        {
            int off = 0;
            for (int k = 0; k < cols.Count; k++)
            {
                var c = cols[k];
                var cell = row.AsSpan(off, widths[k]);
                if (c.Reals is { } re) BinaryPrimitives.WriteDoubleBigEndian(cell, re[r]);
                else if (c.Integers is { } ie) BinaryPrimitives.WriteInt64BigEndian(cell, ie[r]);
                else
                {
                    cell.Fill((byte)' ');
                    var t = c.Texts![r];
                    if (t is not null) Encoding.ASCII.GetBytes(t.AsSpan(0, Math.Min(t.Length, widths[k])), cell);
                }
                off += widths[k];
            }
            s.Write(row, 0, rowBytes);
        }
        long data = (long)rowBytes * table.RowCount;
        long pad = (FitsHeader.BlockBytes - data % FitsHeader.BlockBytes) % FitsHeader.BlockBytes;
        s.Write(new byte[pad]);
    }

    private static string? Clip(string? s) => s is null ? null : new string(s.Select(ch => ch is < ' ' or > '~' ? '?' : ch).Take(60).ToArray());

    private static void WriteHeader(Stream s, List<string> cards)
    {
        cards.Add("END");
        var sb = new StringBuilder();
        foreach (var c in cards) sb.Append(c.PadRight(80)[..80]);
        int pad = (FitsHeader.BlockBytes - sb.Length % FitsHeader.BlockBytes) % FitsHeader.BlockBytes;
        sb.Append(' ', pad);
        s.Write(Encoding.ASCII.GetBytes(sb.ToString()));
    }

    private static string Key(string k) => k.PadRight(8) + "= ";
    private static string WithComment(string card, string? comment) => comment is null ? card : (card + " / " + comment);
    private static string Logical(string k, bool v, string? comment = null) => WithComment(Key(k) + (v ? "T" : "F").PadLeft(20), comment);
    private static string Integer(string k, long v, string? comment = null) => WithComment(Key(k) + v.ToString(CultureInfo.InvariantCulture).PadLeft(20), comment);
    private static string Str(string k, string v, string? comment = null)
    {
        var body = "'" + v.Replace("'", "''").PadRight(8) + "'";
        var card = Key(k) + body.PadRight(20);
        if (comment is not null && card.Length + 3 + comment.Length > 80) comment = comment[..Math.Max(0, 80 - card.Length - 3)];
        return WithComment(card, string.IsNullOrEmpty(comment) ? null : comment);
    }
}

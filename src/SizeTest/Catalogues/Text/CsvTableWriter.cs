using System.Globalization;
using System.Text;
using SizeTest.Foundation.Files;

namespace SizeTest.Catalogues.Text;

/// <summary>Writes a <see cref="CatalogueTable"/> as CSV (header row, RFC 4180 quoting, round-trip number format, null = empty cell), atomically.</summary>
public static class CsvTableWriter
{
    /// <summary>Writes <paramref name="table"/> to <paramref name="path"/> (replacing it; callers check <c>--force</c>).</summary>
    public static void Write(string path, CatalogueTable table) =>
        AtomicFile.Write(path, stream =>
        {
            using var w = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16, leaveOpen: true);
            Write(w, table);
        });

    /// <summary>Writes <paramref name="table"/> as CSV text to <paramref name="writer"/>.</summary>
    public static void Write(TextWriter writer, CatalogueTable table)
    {
        ArgumentNullException.ThrowIfNull(table);
        var cols = table.Columns;
        writer.Write(string.Join(",", cols.Select(c => RejectLog.Quote(c.Name))));
        writer.Write('\n');
        for (int r = 0; r < table.RowCount; r++)
        {
            for (int k = 0; k < cols.Count; k++)
            {
                if (k > 0) writer.Write(',');
                var c = cols[k];
                if (c.Reals is { } re) { if (!double.IsNaN(re[r])) writer.Write(re[r].ToString("R", CultureInfo.InvariantCulture)); }
                else if (c.Integers is { } ie) writer.Write(ie[r].ToString(CultureInfo.InvariantCulture));
                else if (c.Texts is { } te && te[r] is { } s) writer.Write(s.Length == 0 ? "\"\"" : RejectLog.Quote(s));
            }
            writer.Write('\n');
        }
    }
}

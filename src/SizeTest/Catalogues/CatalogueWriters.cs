using SizeTest.Catalogues.Fits;
using SizeTest.Catalogues.Parquet;
using SizeTest.Catalogues.Text;
using SizeTest.Catalogues.VoTable;

namespace SizeTest.Catalogues;

/// <summary>
/// Writing a <see cref="CatalogueTable"/> in any catalogue format, the format chosen by the file's extension (the
/// counterpart of <see cref="CatalogueReaders"/>): CSV, FITS BINTABLE, VOTable or Parquet (uncompressed, the fastest to
/// read; docs/scaling.md). Each writer replaces the file atomically; callers decide whether an existing one may go.
/// </summary>
public static class CatalogueWriters
{
    /// <summary>The format for an output file named <paramref name="path"/>: <c>.csv</c>, <c>.fits</c>/<c>.fit</c>/<c>.fts</c>,
    /// <c>.vot</c>/<c>.votable</c>/<c>.xml</c> or <c>.parquet</c>/<c>.pq</c> (any case); null for another extension.</summary>
    public static CatalogueFormat? FormatOf(string path) => Path.GetExtension(path).ToLowerInvariant() switch
    {
        ".csv" => CatalogueFormat.Text,
        ".fits" or ".fit" or ".fts" => CatalogueFormat.Fits,
        ".vot" or ".votable" or ".xml" => CatalogueFormat.VoTable,
        ".parquet" or ".pq" => CatalogueFormat.Parquet,
        _ => null,
    };

    /// <summary>Writes <paramref name="table"/> to <paramref name="path"/> in <paramref name="format"/> (text as CSV);
    /// <paramref name="description"/> goes into a VOTable's DESCRIPTION (the other formats have no place for it).</summary>
    public static void Write(string path, CatalogueFormat format, CatalogueTable table, string? description = null)
    {
        switch (format)
        {
            case CatalogueFormat.Text:
                CsvTableWriter.Write(path, table);
                break;
            case CatalogueFormat.Parquet:
                ParquetTableWriter.Write(path, table.Columns.Select(c => c.Texts is { } t
                    ? ParquetColumnValues.Text(c.Name, t)
                    : ParquetColumnValues.Number(c.Name, c.Reals ?? c.Integers!.Select(v => (double)v).ToArray())).ToList(),
                    compression: ParquetCompression.None);
                break;
            case CatalogueFormat.Fits:
                FitsTableWriter.Write(path, table);
                break;
            default:
                VoTableWriter.Write(path, table, description);
                break;
        }
    }
}

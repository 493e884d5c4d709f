using System.Text;
using SizeTest.Catalogues.Fits;
using SizeTest.Catalogues.Parquet;
using SizeTest.Catalogues.Text;
using SizeTest.Catalogues.VoTable;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>Opens the right <see cref="ICatalogueReader"/> for a file (by option, magic bytes or extension).</summary>
public static class CatalogueReaders
{
    /// <summary>
    /// Detects the format: FITS if the file starts with <c>SIMPLE  =</c>; VOTable if it is XML
    /// with a <c>VOTABLE</c> element near the start; Parquet if it starts with <c>PAR1</c>; otherwise by extension
    /// (<c>.fits .fit .fts</c> → FITS, <c>.vot .votable .xml</c> → VOTable, <c>.parquet .pq</c> → Parquet), otherwise text
    /// (an IPAC table, with its <c>|</c> header lines, is text read by <see cref="IpacTableReader"/>).
    /// </summary>
    public static CatalogueFormat DetectFormat(string path)
    {
        var head = new byte[4096];
        int n;
        using (var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read))
            n = fs.ReadAtLeast(head, head.Length, throwOnEndOfStream: false);
        var span = head.AsSpan(0, n);
        if (span.StartsWith("SIMPLE  ="u8)) return CatalogueFormat.Fits;
        if (span.StartsWith("PAR1"u8)) return CatalogueFormat.Parquet;
        var text = Encoding.UTF8.GetString(span).TrimStart('\uFEFF', ' ', '\t', '\r', '\n');
        if (text.StartsWith('<') && text.Contains("VOTABLE", StringComparison.Ordinal)) return CatalogueFormat.VoTable;
        return Path.GetExtension(path).ToLowerInvariant() switch
        {
            ".fits" or ".fit" or ".fts" => CatalogueFormat.Fits,
            ".vot" or ".votable" or ".xml" => CatalogueFormat.VoTable,
            ".parquet" or ".pq" => CatalogueFormat.Parquet,
            _ => CatalogueFormat.Text,
        };
    }

    /// <summary>
    /// Opens <paramref name="path"/>. Throws <see cref="InputException"/> when the file is missing
    /// or cannot be read as the detected (or given) format.
    /// </summary>
    public static ICatalogueReader Open(string path, ReaderOptions? options = null)
    {
        options ??= new ReaderOptions();
        if (!File.Exists(path)) throw new InputException("file not found", path);
        try
        {
            var format = options.Format ?? DetectFormat(path);
            switch (format)
            {
                case CatalogueFormat.Fits:
                    return FitsTableReader.Open(path, options.Table);
                case CatalogueFormat.VoTable:
                    return VoTableReader.Open(path, options);
                case CatalogueFormat.Parquet:
                    if (options.Table is not null)
                        throw SettingProblem.Input($"a Parquet file has only one table; drop {{hdu}} '{options.Table}'", path);
                    return ParquetCatalogueReader.Open(path);
                default:
                    if (options.Table is not null)
                        throw SettingProblem.Input($"a text table has only one table; drop {{hdu}} '{options.Table}'", path);
                    if (options.Delimiter is null && options.HasHeader is null && IpacTableReader.Looks(path, options))
                        return IpacTableReader.Open(path, options);
                    var layout = TextLayout.Detect(path, options);
                    return layout.Delimiter == ' '
                        ? new WhitespaceTextReader(path, layout, options)
                        : new DelimitedTextReader(path, layout, options);
            }
        }
        catch (IOException ex) when (ex is not FileNotFoundException)
        {
            throw new InputException($"cannot read the file: {ex.Message}", path, inner: ex);
        }
        catch (UnauthorizedAccessException ex)
        {
            throw new InputException($"cannot read the file: {ex.Message}", path, inner: ex);
        }
    }

    /// <summary>The formats' names as <see cref="TryParseFormat"/> reads them (each also takes other spellings), for messages.</summary>
    public static IReadOnlyList<string> FormatNames { get; } = ["csv", "fits", "votable", "parquet"];

    /// <summary>Parses a <c>--format</c> text for catalogues: <c>csv</c>/<c>text</c>/<c>tsv</c>, <c>fits</c>, <c>votable</c>/<c>vot</c>, <c>parquet</c>.</summary>
    public static bool TryParseFormat(string? text, out CatalogueFormat format)
    {
        switch ((text ?? "").Trim().ToLowerInvariant())
        {
            case "csv" or "tsv" or "text" or "txt" or "ascii": format = CatalogueFormat.Text; return true;
            case "fits" or "fit": format = CatalogueFormat.Fits; return true;
            case "votable" or "vot" or "xml": format = CatalogueFormat.VoTable; return true;
            case "parquet" or "pq": format = CatalogueFormat.Parquet; return true;
            default: format = default; return false;
        }
    }
}

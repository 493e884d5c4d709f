namespace SizeTest.Catalogues;

/// <summary>How to open a catalogue file (everything optional: the default is to detect).</summary>
public sealed record ReaderOptions
{
    /// <summary>The format; null = detect from the first bytes (FITS <c>SIMPLE  =</c>, XML <c>&lt;VOTABLE</c>) and the extension.</summary>
    public CatalogueFormat? Format { get; init; }

    /// <summary>
    /// Which table of a multi-table file: a FITS HDU index (0 = primary, 1 = first extension) or
    /// EXTNAME; a VOTable TABLE index (1-based) or name/ID. Null = the first table.
    /// </summary>
    public string? Table { get; init; }

    /// <summary>Text only: the field delimiter; <c>' '</c> means runs of spaces/tabs. Null = detect (<c>, \t ; |</c>, else whitespace).</summary>
    public char? Delimiter { get; init; }

    /// <summary>Text only: whether the first non-comment line is a header. Null = detect (a line with non-numeric fields, or a last comment line with one name per column).</summary>
    public bool? HasHeader { get; init; }

    /// <summary>Text only: cell texts read as null besides the empty cell. <c>NaN</c>/<c>nan</c> are not among them: a
    /// written-out NaN is a non-finite number and is rejected as such, like <c>inf</c>, in every reader.</summary>
    public IReadOnlyList<string> NullTokens { get; init; } = ["NA", "N/A", "null", "NULL", "None", "--"];

    /// <summary>Text only: the longest line accepted, bytes (default 1 MiB); a longer line is refused naming file and line.</summary>
    public int MaxLineBytes { get; init; } = SizeTest.Foundation.Files.LineCappedStream.DefaultMaxLineBytes;

    /// <summary>The most columns a table may have (default <see cref="DefaultMaxColumns"/>): a text header, a VOTable's
    /// FIELDs or a FITS TFIELDS beyond it is refused naming file and line before any per-column work, so a damaged or
    /// hostile header cannot make the reader allocate without limit.</summary>
    public int MaxColumns { get; init; } = DefaultMaxColumns;

    /// <summary>The default of <see cref="MaxColumns"/>: 10 000, ten times the 999 columns FITS allows (FITS 4.0 §7.3.1) and
    /// well above the widest survey tables in use (a few thousand columns).</summary>
    public const int DefaultMaxColumns = 10_000;

    /// <summary>VOTable TABLEDATA only: the most characters one TD cell may hold (default 1 Mi); a longer cell is refused
    /// naming file, row and column, having read at most this much of it.</summary>
    public int MaxCellChars { get; init; } = 1 << 20;
}

namespace SizeTest.Catalogues;

/// <summary>
/// A streaming reader of one table of a catalogue file. It describes the columns
/// (<see cref="Columns"/>) and then hands out rows in chunks, decoding only the requested
/// columns, each row with its position in the file (1-based line for text, 1-based row for
/// FITS and VOTable). Readers know nothing of roles, units or cosmology.
/// </summary>
/// <remarks>
/// A file that cannot be read at all throws <see cref="SizeTest.Foundation.Errors.InputException"/> naming the file
/// and the position, either when the reader is opened or from <see cref="ReadChunk"/>. A cell that
/// cannot be decoded is not an error of the reader: it is marked <see cref="CellState.Invalid"/>
/// and the loader rejects the row. To add a format, implement this interface and register it in
/// <see cref="CatalogueReaders"/>.
/// </remarks>
public interface ICatalogueReader : IDisposable
{
    /// <summary>The file format.</summary>
    CatalogueFormat Format { get; }

    /// <summary>The file being read (as given by the caller).</summary>
    string SourceName { get; }

    /// <summary>Which table of the file is read (e.g. <c>HDU 1 'GALAXIES'</c>, <c>TABLE 1 'results'</c>); null for single-table formats.</summary>
    string? TableName { get; }

    /// <summary>Other facts about the layout worth showing (delimiter, header line, tables present).</summary>
    IReadOnlyList<string> Notes { get; }

    /// <summary>The columns, in file order.</summary>
    IReadOnlyList<CatalogueColumn> Columns { get; }

    /// <summary>
    /// An upper bound on the number of data rows when it is cheap to know (exact for FITS),
    /// used to size the output arrays once; null when unknown.
    /// </summary>
    long? RowCountHint { get; }

    /// <summary>
    /// Fills <paramref name="chunk"/> with the next rows (up to its capacity) for the columns it
    /// requests. Returns false, with <see cref="RowChunk.Count"/> = 0, at the end of the table.
    /// </summary>
    bool ReadChunk(RowChunk chunk);
}

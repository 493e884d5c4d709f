namespace SizeTest.Catalogues.Text;

/// <summary>
/// What the two text readers share: the table description from <see cref="TextLayout"/> and the
/// record loop that turns each record into a row of the chunk — the file line as its position, a
/// row problem when the field count differs from the header's (one empty field more, a line ending with the delimiter,
/// is none), a missing field as null, and every
/// requested field through the one <see cref="TextCellDecoder"/>. A reader supplies only how to
/// find the next record and its fields.
/// </summary>
internal abstract class TextTableReader(string path, TextLayout layout, ReaderOptions options) : ICatalogueReader
{
    private bool _done;

    /// <summary>The file.</summary>
    protected string Path { get; } = path;

    /// <summary>The detected layout (delimiter, header, columns).</summary>
    protected TextLayout Layout { get; } = layout;

    /// <summary>The shared cell decoder.</summary>
    protected TextCellDecoder Cells { get; } = new(options.NullTokens);

    public CatalogueFormat Format => CatalogueFormat.Text;
    public string SourceName => Path;
    public string? TableName => null;
    public IReadOnlyList<string> Notes => Layout.Notes;
    public IReadOnlyList<CatalogueColumn> Columns => Layout.Columns;
    public long? RowCountHint { get; } = layout.CountRecords(path);

    /// <summary>Moves to the next record; false at the end of the file.</summary>
    /// <param name="line">The 1-based file line where the record starts.</param>
    /// <param name="fieldCount">How many fields the record has.</param>
    protected abstract bool NextRecord(out long line, out int fieldCount);

    /// <summary>What is wrong with the current record as a whole (it becomes the row's reject detail), or null.</summary>
    protected virtual string? RecordProblem() => null;

    /// <summary>Whether field <paramref name="index"/> of the current record (index &lt; field count) is empty.</summary>
    protected abstract bool FieldIsEmpty(int index);

    /// <summary>Decodes field <paramref name="index"/> of the current record (index &lt; field count) with <see cref="Cells"/>.</summary>
    protected abstract void DecodeField(int index, ColumnBuffer buffer, bool asText, int row);

    public bool ReadChunk(RowChunk chunk)
    {
        chunk.Reset();
        if (_done) return false;
        int nCols = Layout.Columns.Count;
        while (!chunk.IsFull)
        {
            if (!NextRecord(out long line, out int fieldCount)) { _done = true; break; }
            int row = chunk.BeginRow(line);
            // A line ending with the delimiter has one empty field after the last column: nothing is in it.
            if (RecordProblem() is { } problem) chunk.SetRowProblem(row, problem);
            else if (fieldCount != nCols && !(fieldCount == nCols + 1 && FieldIsEmpty(nCols)))
                chunk.SetRowProblem(row, $"{fieldCount} fields, the header has {nCols}");
            for (int k = 0; k < chunk.Requests.Count; k++)
            {
                var req = chunk.Requests[k];
                if (req.ColumnIndex >= fieldCount) chunk.Columns[k].SetNull(row);
                else DecodeField(req.ColumnIndex, chunk.Columns[k], req.AsText, row);
            }
        }
        return chunk.Count > 0;
    }

    public abstract void Dispose();
}

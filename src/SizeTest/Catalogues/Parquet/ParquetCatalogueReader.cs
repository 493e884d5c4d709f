using System.Globalization;

namespace SizeTest.Catalogues.Parquet;

/// <summary>
/// <see cref="ICatalogueReader"/> over a Parquet file: hands out the rows of a range of row groups (all of
/// them by default; one rank's share under MPI, see <see cref="Distributed.RowPartition.RowGroups"/>) in
/// chunks, decoding one row group at a time and only the requested columns. Row positions are 1-based
/// table rows of the whole file, so reject-log entries name the same row whichever rank read it.
/// Parquet nulls and IEEE NaN become <see cref="CellState.Null"/>; text requested as a number is parsed
/// (invariant culture) and kept as <see cref="CellState.Invalid"/> when it is not a number.
/// </summary>
public sealed class ParquetCatalogueReader : ICatalogueReader
{
    private readonly ParquetTableReader _table;
    private readonly int _firstGroup, _endGroup;
    private int _group;
    private ParquetRowGroupData? _current;
    private int _offset;
    private string[]? _requestedNames;

    private ParquetCatalogueReader(ParquetTableReader table, int firstGroup, int endGroup)
    {
        _table = table;
        _firstGroup = firstGroup;
        _endGroup = endGroup;
        _group = firstGroup;
        Columns = table.Columns.Select(c => new CatalogueColumn(c.Name, c.Kind switch
        {
            ParquetValueKind.Real => ColumnKind.Real,
            ParquetValueKind.Integer => ColumnKind.Integer,
            ParquetValueKind.Boolean => ColumnKind.Boolean,
            ParquetValueKind.Text => ColumnKind.Text,
            _ => ColumnKind.Unsupported,
        }, null, null, null, c.NativeType + (c.IsNullable ? "?" : ""))).ToArray();
        long rows = 0;
        for (int g = firstGroup; g < endGroup; g++) rows += table.RowGroupRowCounts[g];
        RowCountHint = rows;
        var notes = new List<string> { $"{table.RowGroupCount} row group{(table.RowGroupCount == 1 ? "" : "s")}, {table.RowCount} rows" };
        if (firstGroup != 0 || endGroup != table.RowGroupCount)
            notes.Add($"reading row groups {firstGroup}–{endGroup - 1} ({rows} rows)");
        Notes = notes;
    }

    /// <summary>
    /// Opens <paramref name="path"/> for row groups [<paramref name="firstGroup"/>, <paramref name="endGroup"/>)
    /// (endGroup &lt; 0 = to the last group). Throws <see cref="SizeTest.Foundation.Errors.InputException"/> if the file is not readable Parquet.
    /// </summary>
    public static ParquetCatalogueReader Open(string path, int firstGroup = 0, int endGroup = -1)
    {
        var table = ParquetTableReader.Open(path);
        if (endGroup < 0) endGroup = table.RowGroupCount;
        if (firstGroup < 0 || firstGroup > endGroup || endGroup > table.RowGroupCount)
        {
            table.Dispose();
            throw new ArgumentOutOfRangeException(nameof(endGroup), $"Row groups [{firstGroup}, {endGroup}) are outside the file's {table.RowGroupCount}.");
        }
        return new ParquetCatalogueReader(table, firstGroup, endGroup);
    }

    /// <summary>The underlying row-group reader (row-group counts and offsets).</summary>
    public ParquetTableReader Table => _table;

    /// <inheritdoc />
    public CatalogueFormat Format => CatalogueFormat.Parquet;

    /// <inheritdoc />
    public string SourceName => _table.SourceName;

    /// <inheritdoc />
    public string? TableName => null;

    /// <inheritdoc />
    public IReadOnlyList<string> Notes { get; }

    /// <inheritdoc />
    public IReadOnlyList<CatalogueColumn> Columns { get; }

    /// <inheritdoc />
    public long? RowCountHint { get; }

    /// <inheritdoc />
    public bool ReadChunk(RowChunk chunk)
    {
        ArgumentNullException.ThrowIfNull(chunk);
        chunk.Reset();
        _requestedNames ??= chunk.Requests.Select(r => Columns[r.ColumnIndex].Name).Distinct()
            .Where(n => Columns.First(c => c.Name == n).Kind != ColumnKind.Unsupported).ToArray();
        while (_current is null || _offset >= _current.RowCount)
        {
            if (_group >= _endGroup) return false;
            _current = _table.ReadRowGroup(_group++, _requestedNames);
            _offset = 0;
        }
        int rows = Math.Min(chunk.Capacity, _current.RowCount - _offset);
        for (int r = 0; r < rows; r++) chunk.BeginRow(_current.FirstRow + _offset + r + 1);
        for (int k = 0; k < chunk.Requests.Count; k++)
        {
            var request = chunk.Requests[k];
            var buffer = chunk.Columns[k];
            var info = Columns[request.ColumnIndex];
            if (!_current.Columns.TryGetValue(info.Name, out var values))
            {
                for (int r = 0; r < rows; r++) buffer.SetInvalid(r, $"({info.NativeType} not supported)");
                continue;
            }
            Copy(values, _offset, rows, request.AsText, buffer);
        }
        _offset += rows;
        return true;
    }

    private static void Copy(ParquetColumnValues values, int offset, int rows, bool asText, ColumnBuffer buffer)
    {
        if (values.Texts is { } texts)
        {
            for (int r = 0; r < rows; r++)
            {
                var s = texts[offset + r];
                if (s is null) buffer.SetNull(r);
                else if (asText) buffer.SetText(r, s);
                else if (s.Trim().Length == 0) buffer.SetNull(r);
                else if (NumberText.TryParse(s, out var v)) buffer.SetNumber(r, v);
                else buffer.SetInvalid(r, s);
            }
            return;
        }
        var numbers = values.Numbers!;
        for (int r = 0; r < rows; r++)
        {
            int i = offset + r;
            double v = numbers[i];
            if (values.IsNullAt(i) || double.IsNaN(v)) buffer.SetNull(r);
            else if (asText) buffer.SetText(r, v.ToString("R", CultureInfo.InvariantCulture));
            else buffer.SetNumber(r, v);
        }
    }

    /// <summary>Closes the file.</summary>
    public void Dispose() => _table.Dispose();
}

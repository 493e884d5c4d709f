namespace SizeTest.Catalogues.Parquet;

/// <summary>The decoded columns of one row group.</summary>
/// <param name="Group">Row-group index in the file (0-based).</param>
/// <param name="FirstRow">0-based index of the group's first row in the file (1-based row number of row i is FirstRow + i + 1).</param>
/// <param name="RowCount">Rows in the group.</param>
/// <param name="Columns">The requested columns, by name.</param>
public sealed record ParquetRowGroupData(int Group, long FirstRow, int RowCount, IReadOnlyDictionary<string, ParquetColumnValues> Columns);

namespace SizeTest.Catalogues.Parquet;

/// <summary>One column of a Parquet file as its schema describes it.</summary>
/// <param name="Name">Column name (top-level field name).</param>
/// <param name="Kind">How values are handed out.</param>
/// <param name="IsNullable">Whether the schema allows nulls (definition level &gt; 0).</param>
/// <param name="NativeType">The CLR type Parquet.Net maps the physical/logical type to, for display.</param>
public sealed record ParquetColumnInfo(string Name, ParquetValueKind Kind, bool IsNullable, string NativeType);

namespace SizeTest.Catalogues.Parquet;

/// <summary>How a Parquet column's values are handed out.</summary>
public enum ParquetValueKind
{
    /// <summary>Floating point (DOUBLE, FLOAT); handed out as double.</summary>
    Real,
    /// <summary>Whole numbers (INT8…INT64, unsigned); handed out as double.</summary>
    Integer,
    /// <summary>BOOLEAN; handed out as 0/1.</summary>
    Boolean,
    /// <summary>UTF-8 strings (BYTE_ARRAY with string logical type).</summary>
    Text,
    /// <summary>Anything else (nested, lists, dates, decimals, binary): listed but not decoded.</summary>
    Unsupported,
}

namespace SizeTest.Catalogues.Parquet;

/// <summary>
/// The values of one column for the rows of one row group (or one column to write): numbers or texts,
/// with a null mask. For numbers, <see cref="IsNull"/> marks Parquet nulls (IEEE NaN stays a value; the
/// loader decides what NaN means).
/// </summary>
public sealed class ParquetColumnValues
{
    private ParquetColumnValues(string name, double[]? numbers, string?[]? texts, bool[]? isNull, ParquetValueKind kind)
    {
        ArgumentException.ThrowIfNullOrEmpty(name);
        Name = name;
        Numbers = numbers;
        Texts = texts;
        Kind = kind;
        int n = numbers?.Length ?? texts!.Length;
        if (isNull is not null && isNull.Length != n) throw new ArgumentException($"column '{name}': null mask has {isNull.Length} entries, expected {n}");
        IsNull = isNull;
        Count = n;
    }

    /// <summary>A numeric column (written as DOUBLE; nullable when <paramref name="isNull"/> is given).</summary>
    public static ParquetColumnValues Number(string name, double[] values, bool[]? isNull = null) =>
        new(name, values ?? throw new ArgumentNullException(nameof(values)), null, isNull, ParquetValueKind.Real);

    /// <summary>A text column (written as a nullable UTF-8 string; null entries are nulls).</summary>
    public static ParquetColumnValues Text(string name, string?[] values)
    {
        ArgumentNullException.ThrowIfNull(values);
        bool[]? mask = null;
        for (int i = 0; i < values.Length; i++)
            if (values[i] is null) (mask ??= new bool[values.Length])[i] = true;
        return new(name, null, values, mask, ParquetValueKind.Text);
    }

    internal static ParquetColumnValues Read(string name, double[] values, bool[]? isNull, ParquetValueKind kind) => new(name, values, null, isNull, kind);

    /// <summary>Column name.</summary>
    public string Name { get; }

    /// <summary>Kind of the values (numbers for Real, Integer and Boolean; texts for Text).</summary>
    public ParquetValueKind Kind { get; }

    /// <summary>Number of rows.</summary>
    public int Count { get; }

    /// <summary>Numeric values (undefined where <see cref="IsNull"/> is true), or null for a text column.</summary>
    public double[]? Numbers { get; }

    /// <summary>Text values (null entries are nulls), or null for a numeric column.</summary>
    public string?[]? Texts { get; }

    /// <summary>Null mask (true = null), or null when the column has no nulls.</summary>
    public bool[]? IsNull { get; }

    /// <summary>Whether row <paramref name="row"/> is null.</summary>
    public bool IsNullAt(int row) => IsNull is { } m && m[row];
}

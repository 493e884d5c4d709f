namespace SizeTest.Catalogues.VoTable;

/// <summary>One FIELD of a VOTable TABLE (VOTable 1.4 §4.1–4.3, §5.1).</summary>
internal sealed class VoTableField
{
    public required string Name { get; init; }
    public required string Datatype { get; init; }
    public required string? ArraySize { get; init; }
    public required string? Unit { get; init; }
    public required string? Ucd { get; init; }
    public required string? Description { get; init; }
    public required string? NullText { get; init; }   // VALUES null=

    /// <summary>Fixed element count (product of the dimensions), or −1 when the last dimension is variable (<c>*</c>).</summary>
    public int FixedCount { get; init; } = 1;

    /// <summary>Bytes of one element in the binary serialisations (bit: see <see cref="IsBit"/>).</summary>
    public int ElementBytes => Datatype switch
    {
        "boolean" or "unsignedByte" or "char" => 1,
        "short" or "unicodeChar" => 2,
        "int" or "float" => 4,
        "long" or "double" or "floatComplex" => 8,
        "doubleComplex" => 16,
        _ => 0,
    };

    public bool IsBit => Datatype == "bit";
    public bool IsChar => Datatype is "char" or "unicodeChar";
    public bool IsInteger => Datatype is "unsignedByte" or "short" or "int" or "long";
    public bool IsFloat => Datatype is "float" or "double";

    public ColumnKind Kind =>
        IsChar ? ColumnKind.Text
        : FixedCount != 1 ? ColumnKind.Unsupported
        : Datatype == "boolean" || IsBit ? ColumnKind.Boolean
        : IsInteger ? ColumnKind.Integer
        : IsFloat ? ColumnKind.Real
        : ColumnKind.Unsupported;

    /// <summary>Parses an arraysize (<c>10</c>, <c>*</c>, <c>10*</c>, <c>3x4</c>, <c>3x*</c>) into a fixed count or −1 (variable); null on nonsense.</summary>
    public static int? ParseArraySize(string? arraysize)
    {
        if (string.IsNullOrWhiteSpace(arraysize)) return 1;
        long product = 1;
        foreach (var part in arraysize.Trim().Split('x'))
        {
            var p = part.Trim();
            if (p.EndsWith('*')) return -1;
            if (!int.TryParse(p, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var n) || n < 0) return null;
            product *= n;
            if (product > int.MaxValue) return null;
        }
        return (int)product;
    }
}

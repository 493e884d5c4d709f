namespace SizeTest.Catalogues;

/// <summary>One in-memory column to be written by a table writer. Exactly one of the value arrays is set.</summary>
/// <param name="Name">Column name.</param>
/// <param name="Kind"><see cref="ColumnKind.Real"/>, <see cref="ColumnKind.Integer"/> or <see cref="ColumnKind.Text"/>.</param>
/// <param name="Unit">Unit string (VOUnit spelling preferred), or null.</param>
/// <param name="Ucd">IVOA UCD, or null.</param>
/// <param name="Description">Description, or null.</param>
/// <param name="Reals">Values of a real column (NaN = null).</param>
/// <param name="Integers">Values of an integer column.</param>
/// <param name="Texts">Values of a text column (null = null).</param>
public sealed record TableColumn(string Name, ColumnKind Kind, string? Unit, string? Ucd, string? Description,
    double[]? Reals = null, long[]? Integers = null, string?[]? Texts = null)
{
    /// <summary>Number of values.</summary>
    public int Length => Reals?.Length ?? Integers?.Length ?? Texts?.Length ?? 0;
}

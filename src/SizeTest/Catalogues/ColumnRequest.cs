namespace SizeTest.Catalogues;

/// <summary>One column the loader wants from a reader.</summary>
/// <param name="ColumnIndex">Index into <see cref="ICatalogueReader.Columns"/>.</param>
/// <param name="AsText">True to receive text (identifiers, bands); false to receive numbers (booleans read as 0/1, text is parsed).</param>
public readonly record struct ColumnRequest(int ColumnIndex, bool AsText);

namespace SizeTest.Catalogues;

/// <summary>One column of a catalogue as its file describes it.</summary>
/// <param name="Name">Column name (FITS TTYPEn, VOTable FIELD name, CSV header cell). Vector elements are named <c>NAME[k]</c>, k 1-based.</param>
/// <param name="Kind">Logical type.</param>
/// <param name="Unit">Unit string from the file (TUNITn, FIELD unit, <c>name [unit]</c> in a CSV header), or null.</param>
/// <param name="Ucd">IVOA Unified Content Descriptor (FIELD ucd, FITS TUCDn), or null.</param>
/// <param name="Description">Free-text description (FIELD DESCRIPTION, the TTYPEn card comment), or null.</param>
/// <param name="NativeType">The type as the file spells it (e.g. <c>1J</c>, <c>double</c>, <c>text</c>), for display.</param>
public sealed record CatalogueColumn(string Name, ColumnKind Kind, string? Unit, string? Ucd, string? Description, string NativeType);

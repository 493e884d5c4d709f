using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// What the user said about the catalogue's columns: explicit role assignments, the size
/// definition, extra numeric columns to keep, and whether the remaining roles may be detected
/// from column names and UCDs. Everything left unsaid is detected and reported.
/// </summary>
public sealed record ColumnMapping
{
    /// <summary>The empty mapping: detect every role.</summary>
    public static ColumnMapping Detect { get; } = new();

    /// <summary>Explicit assignments (at most one per role).</summary>
    public IReadOnlyList<ColumnAssignment> Assignments { get; init; } = [];

    /// <summary>How the size was measured; null = inferred from the size column's name or the default (effective radius), reported either way.</summary>
    public SizeDefinition? SizeDefinition { get; init; }

    /// <summary>Further numeric columns to keep in <see cref="CatalogueRows.ExtraColumns"/> by name (e.g. K-corrections, extinction).</summary>
    public IReadOnlyList<string> Keep { get; init; } = [];

    /// <summary>Whether roles not assigned are detected (default true). When false only the assignments are used.</summary>
    public bool DetectOthers { get; init; } = true;

    /// <summary>
    /// Parses <c>ROLE=NAME[:UNIT]</c> (see <see cref="ColumnAssignment.Parse"/>): the one parser for
    /// <c>--col</c> and the study file.
    /// </summary>
    public static ColumnAssignment ParseAssignment(string text) => ColumnAssignment.Parse(text);

    /// <summary>
    /// Builds a mapping from <c>--col</c> texts, a <c>--size-def</c> text and <c>--keep</c> names,
    /// throwing <see cref="InputException"/> on the first bad one or a role given twice.
    /// </summary>
    public static ColumnMapping FromOptions(IEnumerable<string>? assignments, string? sizeDefinition = null, IEnumerable<string>? keep = null)
    {
        var list = new List<ColumnAssignment>();
        foreach (var text in assignments ?? [])
        {
            var a = ColumnAssignment.Parse(text);
            if (list.Any(x => x.Role == a.Role))
                throw new InputException($"role {a.Role.Name()} is assigned twice ('{text}'); give each role once");
            list.Add(a);
        }
        SizeDefinition? def = null;
        if (!string.IsNullOrWhiteSpace(sizeDefinition))
        {
            if (!SizeDefinitions.TryParse(sizeDefinition, out var d, out var error)) throw new InputException(error);
            def = d;
        }
        return new ColumnMapping { Assignments = list, SizeDefinition = def, Keep = (keep ?? []).ToArray() };
    }
}

namespace SizeTest.Catalogues;

/// <summary>The mapping actually used for one catalogue: which column plays which role, in which unit, and why.</summary>
public sealed class ResolvedMapping
{
    internal ResolvedMapping(IReadOnlyDictionary<ColumnRole, RoleBinding> roles, IReadOnlyList<(string Name, int ColumnIndex)> kept,
        SizeDefinition sizeDefinition, string sizeDefinitionReason, IReadOnlyList<string> notes)
    {
        Roles = roles;
        Kept = kept;
        SizeDefinition = sizeDefinition;
        SizeDefinitionReason = sizeDefinitionReason;
        Notes = notes;
    }

    /// <summary>The bound roles.</summary>
    public IReadOnlyDictionary<ColumnRole, RoleBinding> Roles { get; }

    /// <summary>Extra numeric columns kept by name.</summary>
    public IReadOnlyList<(string Name, int ColumnIndex)> Kept { get; }

    /// <summary>The size definition that travels with the sample.</summary>
    public SizeDefinition SizeDefinition { get; }

    /// <summary>Why that size definition (<c>given with {size_def}</c>, <c>column name 'petroR50' says Petrosian</c>, <c>default</c>).</summary>
    public string SizeDefinitionReason { get; }

    /// <summary>Further remarks: candidates passed over and why, roles left unmapped. Here, in <see cref="RoleBinding.Reason"/>
    /// and in <see cref="SizeDefinitionReason"/> settings are written <c>{col}</c>, <c>{size_def}</c>
    /// (<see cref="Foundation.Errors.SettingProblem.RenderText"/>): whoever shows the text spells them.</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <summary>The warnings among <see cref="Notes"/> (a <c>--col</c> unit that differs from the file's declared unit, an
    /// error read in its value's given unit), without the <c>warning: </c> prefix; the CLI prints them on stderr.</summary>
    public IReadOnlyList<string> Warnings =>
        Notes.Where(n => n.StartsWith("warning: ", StringComparison.Ordinal)).Select(n => n["warning: ".Length..]).ToArray();

    /// <summary>The same mapping with <paramref name="more"/> added to <see cref="Notes"/> (warnings found by the reader or in the data).</summary>
    internal ResolvedMapping WithNotes(IEnumerable<string> more) => new(Roles, Kept, SizeDefinition, SizeDefinitionReason, [.. Notes, .. more]);

    /// <summary>The detection report as text lines: one <c>role ← column (because …)</c> line per role, the size definition, kept columns and notes.</summary>
    public IReadOnlyList<string> ReportLines()
    {
        var lines = new List<string>();
        foreach (var role in ColumnRoles.All)
            if (Roles.TryGetValue(role, out var b)) lines.Add(b.Describe());
        lines.Add($"size definition: {SizeDefinitions.Format(SizeDefinition)} (because {SizeDefinitionReason})");
        foreach (var (name, _) in Kept) lines.Add("kept column: " + Foundation.Errors.SettingProblem.Literal(name));
        var missing = ColumnRoles.All.Where(r => !Roles.ContainsKey(r)).Select(r => r.Name()).ToArray();
        if (missing.Length > 0) lines.Add($"not mapped: {string.Join(", ", missing)}");
        lines.AddRange(Notes);
        return lines;
    }
}

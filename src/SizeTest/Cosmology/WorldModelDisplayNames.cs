namespace SizeTest.Cosmology;

/// <summary>
/// The names people read for each world model (figures, tables, sentences); machine names stay in results.json.
/// ΛCDM, wCDM and CPL (Chevallier &amp; Polarski 2001; Linder 2003) are the trade's usual spellings.
/// </summary>
public static class WorldModelDisplayNames
{
    private static readonly Dictionary<string, string> Names = new(StringComparer.OrdinalIgnoreCase)
    {
        ["lcdm"] = "ΛCDM",
        ["wcdm"] = "wCDM",
        ["w0wacdm"] = "CPL",
        ["eds"] = "Einstein–de Sitter",
        ["milne"] = "Milne",
        ["static-linear"] = "static linear",
        ["tired-light"] = "tired light",
    };

    /// <summary>The display name of a model (its machine name when it has none).</summary>
    public static string For(string name) => Names.TryGetValue(name, out var d) ? d : name;
}

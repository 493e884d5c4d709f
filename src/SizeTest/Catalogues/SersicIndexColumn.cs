using System.Text;

namespace SizeTest.Catalogues;

/// <summary>
/// Whether a column with a morphological-parameter UCD holds the Sérsic index. The IVOA UCD1+ vocabulary has no word of
/// its own for it: <c>src.morph.param</c> ("morphological parameter") covers every shape parameter — Sérsic indices, but also
/// concentrations, classification parameters and, in some tables, axis ratios and position angles (whose own words are
/// <c>phys.size.axisRatio</c>, <c>pos.posAng</c>, <c>src.ellipticity</c>); SExtractor writes its Sérsic index
/// (<c>SPHEROID_SERSICN</c>, "Spheroid Sersic index from fitting") as <c>src.morph;stat.fit.param</c>. Such a column is the
/// Sérsic index only when its name or its description says so, and never when either says it is an axis ratio, a
/// position angle, an ellipticity or a concentration.
/// </summary>
internal static class SersicIndexColumn
{
    // Names of a Sérsic index, normalised (lower case, letters and digits only): n, n_ser, nser, n_sersic, sersic_n, sersic_index.
    private static readonly string[] Names = ["n", "nser", "nsersic", "sersicn", "sersic", "sersicindex"];

    // Words of names that say another shape parameter: q and b/a (axis ratio), pa (position angle), ell (ellipticity), …
    private static readonly string[] OtherNameWords = ["q", "ba", "boa", "pa", "phi", "ell", "inc", "incl", "c", "conc"];
    private static readonly string[] OtherNameParts = ["axis", "ratio", "ellip", "aspect", "posang", "angle", "incl", "concentr"];
    private static readonly string[] OtherDescriptionParts = ["axis", "ratio", "b/a", "position angle", "ellipticit", "aspect", "inclination", "concentration"];

    /// <summary>
    /// Why the column is taken as the Sérsic index (<c>a Sérsic-index name</c>, <c>a description of a Sérsic index</c>), or
    /// null when it is not: its UCD has no <c>src.morph.param</c> (or plain <c>src.morph</c>) word, or its name or description
    /// does not say Sérsic index, or says another shape parameter.
    /// </summary>
    /// <param name="column">The column.</param>
    /// <param name="ucdWords">Its UCD words, lower case.</param>
    public static string? Reason(CatalogueColumn column, IReadOnlyList<string> ucdWords)
    {
        if (!ucdWords.Any(w => w is "src.morph.param" or "src.morph")) return null;
        if (ucdWords.Any(w => w.StartsWith("phys.size.axisratio", StringComparison.Ordinal) || w.StartsWith("pos.posang", StringComparison.Ordinal)
                              || w.StartsWith("src.ellipticity", StringComparison.Ordinal))) return null;
        var words = ColumnNameWords.Split(column.Name);
        string name = string.Concat(words);
        if (words.Any(OtherNameWords.Contains) || OtherNameParts.Any(name.Contains)) return null;
        string description = Fold(column.Description ?? "");
        bool sersicDescription = description.Contains("sersic", StringComparison.Ordinal);
        if (!sersicDescription && OtherDescriptionParts.Any(p => description.Contains(p, StringComparison.Ordinal))) return null;
        if (Names.Contains(name) || name.Contains("sersic", StringComparison.Ordinal)) return "a Sérsic-index name";
        // "index" alone is not enough ("concentration index", "spiral index"): a profile's index is.
        if (sersicDescription || (description.Contains("index", StringComparison.Ordinal) && description.Contains("profile", StringComparison.Ordinal)))
            return "a description of a Sérsic index";
        return null;
    }

    // Lower case, with the accented Latin-1 vowels of "Sérsic" and its misspellings plain (the build has no ICU normalisation).
    private static string Fold(string text)
    {
        var sb = new StringBuilder(text.Length);
        foreach (char ch in text.ToLowerInvariant())
            if (ch is < '\u0300' or > '\u036F') // combining accents (a decomposed "Se\u0301rsic") are dropped
                sb.Append(ch switch
                {
                    'é' or 'è' or 'ê' or 'ë' => 'e',
                    'á' or 'à' or 'â' or 'ä' => 'a',
                    'í' or 'ì' or 'î' or 'ï' => 'i',
                    'ó' or 'ò' or 'ô' or 'ö' => 'o',
                    'ú' or 'ù' or 'û' or 'ü' => 'u',
                    _ => ch,
                });
        return sb.ToString();
    }
}

using System.Text.RegularExpressions;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// Warns when the column mapped to the total magnitude <c>mag</c> looks like a surface brightness: its UCD is
/// <c>phot.mag.sb</c> or its name reads as one (<c>MU_MEAN</c>, <c>SB_e</c>, <c>mu_eff</c>, <c>surf_bright</c>). The two share
/// the unit "mag" in many catalogues, so the unit check cannot tell them apart, but a surface brightness read as a magnitude
/// shifts every luminosity by 2.5 log10(2π θ²) — several magnitudes, changing with size — and biases the size–luminosity slope.
/// </summary>
public static partial class MagnitudeColumnCheck
{
    [GeneratedRegex(@"^(mu|sb|surf|surface)([_\-. ]|$)|^(mu|sb)(e|eff|mean|0|e_?\w*)$|surf_?bright|surfacebrightness", RegexOptions.IgnoreCase)]
    private static partial Regex SurfaceBrightnessName();

    /// <summary>The warnings (with the <c>warning: </c> prefix) for the <c>mag</c> binding of <paramref name="mapping"/>; empty when
    /// <c>mag</c> is not mapped or its column looks like a total magnitude.</summary>
    public static IReadOnlyList<string> Check(ResolvedMapping mapping, IReadOnlyList<CatalogueColumn> columns)
    {
        ArgumentNullException.ThrowIfNull(mapping);
        ArgumentNullException.ThrowIfNull(columns);
        if (!mapping.Roles.TryGetValue(ColumnRole.Mag, out var b)) return [];
        var col = b.ColumnIndex >= 0 && b.ColumnIndex < columns.Count ? columns[b.ColumnIndex] : null;
        bool ucd = col?.Ucd is { } u && u.Split(';').Any(w => w.Trim().Equals("phot.mag.sb", StringComparison.OrdinalIgnoreCase));
        bool name = SurfaceBrightnessName().IsMatch(b.ColumnName);
        if (!ucd && !name) return [];
        return [$"warning: the column {SettingProblem.Literal($"'{b.ColumnName}'")} mapped to mag (the total magnitude) looks like a surface brightness " +
                $"({(ucd ? "its UCD is phot.mag.sb" : "by its name")}); luminosities from it would be off by 2.5 log10(2 pi theta^2). " +
                "Map the total magnitude with {col} mag=NAME, or map this column as mu."];
    }
}

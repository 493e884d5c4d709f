namespace SizeTest.Catalogues;

/// <summary>
/// The survey roles of a <see cref="CatalogueRows"/>, each null when the catalogue lacks it. Values are normalised:
/// absolute magnitude in mag and log10 stellar mass (both as the catalogue computed them, in its reference
/// cosmology), flux density in Jy, Sérsic index dimensionless, group a text label, weight &gt; 0.
/// </summary>
/// <param name="AbsMag">Absolute magnitude per object (reference cosmology), mag.</param>
/// <param name="LogMass">log10(M*/M_⊙) per object (reference cosmology).</param>
/// <param name="FluxDensityJy">Flux density S_ν, Jy.</param>
/// <param name="SersicN">Sérsic index per object.</param>
/// <param name="Group">Population label per object.</param>
/// <param name="Weight">Per-object weight.</param>
public sealed record SurveyColumns(
    double[]? AbsMag = null,
    double[]? LogMass = null,
    double[]? FluxDensityJy = null,
    double[]? SersicN = null,
    string[]? Group = null,
    double[]? Weight = null)
{
    /// <summary>No survey columns.</summary>
    public static SurveyColumns None { get; } = new();
}

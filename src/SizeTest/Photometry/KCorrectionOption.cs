namespace SizeTest.Photometry;

/// <summary>
/// How the per-object K-correction K_QR (Hogg et al. 2002 convention, mag, added to the model
/// surface brightness; includes the (1+z) bandwidth factor) is obtained.
/// </summary>
public abstract record KCorrectionOption
{
    private protected KCorrectionOption() { }

    /// <summary>No K-correction (K = 0): the surface brightnesses are taken as already rest-frame.</summary>
    public sealed record None : KCorrectionOption;

    /// <summary>K per object from a catalogue column (mag, Hogg et al. 2002 sign convention).</summary>
    /// <param name="ColumnName">Name in <see cref="Catalogues.CatalogueRows.ExtraColumns"/>.</param>
    public sealed record Column(string ColumnName) : KCorrectionOption;

    /// <summary>Power law f_ν ∝ ν^α; same band: K = −2.5(1+α) log10(1+z) (<see cref="PowerLawKCorrection"/>).</summary>
    /// <param name="Alpha">Spectral index α.</param>
    public sealed record PowerLaw(double Alpha) : KCorrectionOption;

    /// <summary>A spectral template through filter curves (<see cref="TemplateKCorrection"/>).</summary>
    /// <param name="Spectrum">Rest-frame template.</param>
    /// <param name="ObservedBand">Observed band R (may be null only with band matching, which supplies the bands).</param>
    /// <param name="RestBand">Rest-frame band Q; null = same as the observed band.</param>
    /// <param name="ObservedReference">Reference spectrum of the observed magnitudes; null = AB.</param>
    /// <param name="RestReference">Reference spectrum of the rest-frame magnitudes; null = AB.</param>
    public sealed record Template(
        SpectralTable Spectrum,
        FilterResponse? ObservedBand,
        FilterResponse? RestBand = null,
        SpectralTable? ObservedReference = null,
        SpectralTable? RestReference = null) : KCorrectionOption;
}

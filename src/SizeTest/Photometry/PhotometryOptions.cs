namespace SizeTest.Photometry;

/// <summary>
/// Every photometric choice for one catalogue: K-correction, extinction, zero points, band
/// matching, Sérsic index and surface-brightness definition. Build it directly or with
/// <see cref="PhotometryOptionParser"/> from option strings; apply it with <see cref="ObservablesBuilder"/>.
/// </summary>
public sealed record PhotometryOptions
{
    /// <summary>No corrections at all: equivalent to <see cref="Observables.FromRows"/>.</summary>
    public static PhotometryOptions Default { get; } = new();

    /// <summary>K-correction; default none.</summary>
    public KCorrectionOption KCorrection { get; init; } = new KCorrectionOption.None();

    /// <summary>Galactic extinction; default none.</summary>
    public ExtinctionOption Extinction { get; init; } = new ExtinctionOption.None();

    /// <summary>
    /// AB offsets per band, m_AB = m_native + offset (e.g. a Vega-to-AB table); applied to μ, m
    /// and the isophote so that all surface brightness is AB mag/arcsec². Null = already AB.
    /// </summary>
    public BandTable? ZeroPoints { get; init; }

    /// <summary>Band of every object when the sample has no band column (for zero points and extinction coefficients).</summary>
    public string? DefaultBand { get; init; }

    /// <summary>Band matching to a rest-frame target band, or null.</summary>
    public BandMatchOption? BandMatch { get; init; }

    /// <summary>Sérsic index n for surface-brightness conversions and isophotal sizes, or null.</summary>
    public double? SersicIndex { get; init; }

    /// <summary>Surface-brightness source and definition.</summary>
    public SurfaceBrightnessOption SurfaceBrightness { get; init; } = SurfaceBrightnessOption.AsGiven;

    /// <summary>Per-model luminosities or masses for a size–luminosity relation or a luminosity window; null = none.</summary>
    public LuminosityOption? Luminosity { get; init; }

    /// <summary>Redshift step of the K(z) table used for template K-corrections (default 10⁻³).</summary>
    public double TemplateRedshiftStep { get; init; } = 1e-3;
}

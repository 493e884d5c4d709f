namespace SizeTest.Photometry;

/// <summary>
/// What the likelihood consumes: per object, redshift, log angular size and corrected
/// surface brightness with their errors, plus the per-object corrections that enter the
/// surface-brightness model. Column-oriented; optional parts are null.
/// </summary>
/// <remarks>
/// The Tolman model reads μ_i ≈ μ0 + 2.5 n log10(1+z_i) − 2.5 b log10(1+z_i) + K_i + A_i,
/// so <see cref="KCorrection"/> and <see cref="Extinction"/> are additive terms on the model
/// side, in mag. Surface brightness here is AB mag/arcsec² after zero-point offsets.
/// </remarks>
public sealed class Observables
{
    /// <summary>Builds the observables; present arrays must all have the length of <paramref name="z"/>.</summary>
    public Observables(
        double[] z,
        double[]? lnTheta = null,
        double[]? lnThetaErr = null,
        double[]? mu = null,
        double[]? muErr = null,
        double[]? kCorrection = null,
        double[]? extinction = null,
        double[]? mag = null,
        double[]? magErr = null,
        Catalogues.SizeDefinition? sizeDefinition = null,
        double[]? isophote = null,
        double? sersicIndex = null,
        SurveyObservables? survey = null)
    {
        Count = z.Length;
        Z = z;
        LnTheta = Check(lnTheta, nameof(lnTheta));
        LnThetaErr = Check(lnThetaErr, nameof(lnThetaErr));
        Mu = Check(mu, nameof(mu));
        MuErr = Check(muErr, nameof(muErr));
        KCorrection = Check(kCorrection, nameof(kCorrection));
        Extinction = Check(extinction, nameof(extinction));
        Mag = Check(mag, nameof(mag));
        MagErr = Check(magErr, nameof(magErr));
        SizeDefinition = sizeDefinition ?? Catalogues.SizeDefinition.Effective;
        Isophote = Check(isophote, nameof(isophote));
        SersicIndex = sersicIndex;
        Survey = survey ?? SurveyObservables.None;
        Survey.CheckLength(Count);
    }

    /// <summary>Redshift errors, luminosity data, per-object Sérsic indices, groups and weights (parts null when absent).</summary>
    public SurveyObservables Survey { get; }

    /// <summary>A copy with other survey quantities.</summary>
    public Observables WithSurvey(SurveyObservables survey) =>
        new(Z, LnTheta, LnThetaErr, Mu, MuErr, KCorrection, Extinction, Mag, MagErr, SizeDefinition, Isophote, SersicIndex, survey);

    private double[]? Check(double[]? a, string name) =>
        a is null || a.Length == Count ? a : throw new ArgumentException($"{name} has {a.Length} entries, expected {Count}");

    /// <summary>Number of objects.</summary>
    public int Count { get; }

    /// <summary>Redshift.</summary>
    public double[] Z { get; }

    /// <summary>Natural log of the angular size in radians.</summary>
    public double[]? LnTheta { get; }

    /// <summary>1σ error of ln θ (= σ_θ/θ to first order).</summary>
    public double[]? LnThetaErr { get; }

    /// <summary>Surface brightness, AB mag/arcsec².</summary>
    public double[]? Mu { get; }

    /// <summary>1σ error of μ, mag/arcsec².</summary>
    public double[]? MuErr { get; }

    /// <summary>Per-object K-correction added to the SB model, mag; null = 0.</summary>
    public double[]? KCorrection { get; }

    /// <summary>Per-object Galactic extinction added to the SB model, mag; null = 0.</summary>
    public double[]? Extinction { get; }

    /// <summary>Total magnitude, if present (for a magnitude limit).</summary>
    public double[]? Mag { get; }

    /// <summary>Total-magnitude error, if present.</summary>
    public double[]? MagErr { get; }

    /// <summary>How the size was measured.</summary>
    public Catalogues.SizeDefinition SizeDefinition { get; }

    /// <summary>
    /// For isophotal sizes: the isophote level per object in AB mag/arcsec² (the sample's
    /// isophote after its band's zero-point offset); null for other size definitions.
    /// Use with <see cref="SersicIndex"/> and <see cref="IsophotalSize"/>.
    /// </summary>
    public double[]? Isophote { get; }

    /// <summary>Sérsic index n assumed for the profiles (isophotal sizes, SB conversions), or null.</summary>
    public double? SersicIndex { get; }

    /// <summary>
    /// The simplest conversion: no K-correction, no extinction, sizes converted to ln θ
    /// (error σ_θ/θ; objects without a size error get 0 and rely on intrinsic scatter).
    /// The photometry stage builds richer observables from the same sample.
    /// </summary>
    public static Observables FromRows(Catalogues.CatalogueRows sample)
    {
        ArgumentNullException.ThrowIfNull(sample);
        double[]? lnTheta = null, lnErr = null;
        if (sample.ThetaRad is { } th)
        {
            lnTheta = new double[th.Length];
            lnErr = new double[th.Length];
            for (int i = 0; i < th.Length; i++)
            {
                lnTheta[i] = Math.Log(th[i]);
                lnErr[i] = sample.ThetaErrRad is { } e ? e[i] / th[i] : 0.0;
            }
        }
        return new Observables(sample.Z, lnTheta, lnErr, sample.Mu, sample.MuErr,
            mag: sample.Mag, magErr: sample.MagErr, sizeDefinition: sample.SizeDefinition,
            survey: new SurveyObservables(sample.ZErr, null, sample.Survey.SersicN, sample.Survey.Group, sample.Survey.Weight,
                CompactRadioSources: sample.Survey.FluxDensityJy is not null));
    }
}

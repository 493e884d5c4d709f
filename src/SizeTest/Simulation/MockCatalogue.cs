using SizeTest.Catalogues;
using SizeTest.Photometry;
using SizeTest.Foundation.Angles;

namespace SizeTest.Simulation;

/// <summary>
/// A drawn mock catalogue and its truth: the observed columns (what a survey would publish) and, per object,
/// the true redshift, angular size and surface brightness, plus how many objects were drawn to get
/// <see cref="Count"/> past the selection. Column-oriented; arrays have length <see cref="Count"/>.
/// </summary>
public sealed class MockCatalogue
{
    internal MockCatalogue(MockSurveySpec spec, MockColumns c, long drawn, long failedSb, long failedMag, long failedSize)
    {
        Spec = spec;
        Count = c.Count;
        Z = c.ZObs;
        ZErr = spec.Design.MeasurementErrors.PhotoZError > 0 ? c.ZErr : null;
        ThetaArcsec = c.ThetaObs;
        ThetaErrArcsec = c.ThetaErr;
        bool galaxy = spec.Design.Kind == MockObjectKind.Galaxy;
        Mu = galaxy ? c.MuObs : null;
        MuErr = galaxy ? c.MuErr : null;
        Mag = galaxy ? c.Mag : null;
        LogLuminosity = galaxy ? null : c.LogL;
        ZTrue = c.ZTrue;
        ThetaTrueArcsec = c.ThetaTrue;
        MuTrue = galaxy ? c.MuTrue : null;
        SizeKpc = c.SizeKpc;
        var survey = spec.SurveyTruth;
        TrueAbsMag = galaxy && survey.LuminosityFunction is not null ? c.AbsMag : null;
        FluxDensityJy = galaxy ? null : c.FluxJy;
        Group = galaxy && survey.Groups.Count > 0 ? Array.ConvertAll(c.Group[..c.Count], q => survey.Groups[q].Name) : null;
        Drawn = drawn;
        FailedSbLimit = failedSb;
        FailedMagLimit = failedMag;
        FailedMinSize = failedSize;
    }

    /// <summary>The spec the catalogue was drawn from.</summary>
    public MockSurveySpec Spec { get; }

    /// <summary>Objects in the catalogue.</summary>
    public int Count { get; }

    /// <summary>Observed redshift (photometric when <see cref="MeasurementErrors.PhotoZError"/> &gt; 0).</summary>
    public double[] Z { get; }

    /// <summary>Redshift error σ_z (1+z_obs), or null for spectroscopic redshifts.</summary>
    public double[]? ZErr { get; }

    /// <summary>Observed angular size, arcsec (effective radius, or VLBI core size for radio sources).</summary>
    public double[] ThetaArcsec { get; }

    /// <summary>Angular-size error, arcsec (= σ_ln · θ_obs).</summary>
    public double[] ThetaErrArcsec { get; }

    /// <summary>Observed mean surface brightness within R_e, mag/arcsec² (galaxies only).</summary>
    public double[]? Mu { get; }

    /// <summary>Surface-brightness error, mag/arcsec² (galaxies only).</summary>
    public double[]? MuErr { get; }

    /// <summary>Total magnitude from the observed μ and θ, m = μ − 2.5 log10(2π θ²) (galaxies only).</summary>
    public double[]? Mag { get; }

    /// <summary>log10 of the radio luminosity in W/Hz (radio sources only).</summary>
    public double[]? LogLuminosity { get; }

    /// <summary>True absolute magnitude (galaxies drawn from a luminosity function; not written to the catalogue, which carries
    /// the apparent magnitude: each world model computes its own M from it).</summary>
    public double[]? TrueAbsMag { get; }

    /// <summary>Radio flux density S_ν in Jy (radio sources only).</summary>
    public double[]? FluxDensityJy { get; }

    /// <summary>Population label per object (mixed populations only).</summary>
    public string[]? Group { get; }

    /// <summary>True redshift.</summary>
    public double[] ZTrue { get; }

    /// <summary>True angular size, arcsec.</summary>
    public double[] ThetaTrueArcsec { get; }

    /// <summary>True surface brightness, mag/arcsec² (galaxies only).</summary>
    public double[]? MuTrue { get; }

    /// <summary>True physical (proper) size, kpc (radio sources: ℓ in kpc, i.e. pc/1000).</summary>
    public double[] SizeKpc { get; }

    /// <summary>Objects drawn before selection to obtain <see cref="Count"/> that pass.</summary>
    public long Drawn { get; }

    /// <summary>Drawn objects that failed the SB limit (counted first).</summary>
    public long FailedSbLimit { get; }

    /// <summary>Drawn objects that passed the SB limit but failed the magnitude limit.</summary>
    public long FailedMagLimit { get; }

    /// <summary>Drawn objects that passed the SB and magnitude limits but were smaller than the resolution limit.</summary>
    public long FailedMinSize { get; }

    /// <summary>Fraction of drawn objects that passed the selection, Count / Drawn.</summary>
    public double PassFraction => Drawn == 0 ? double.NaN : (double)Count / Drawn;

    /// <summary>Object identifier of row <paramref name="i"/> (0-based): a prefix (<c>G</c> galaxy, <c>R</c> radio) and the 1-based row number, zero-padded.</summary>
    public string Id(int i)
    {
        int digits = Math.Max(5, Count.ToString(System.Globalization.CultureInfo.InvariantCulture).Length);
        return (Spec.Design.Kind == MockObjectKind.Galaxy ? "G" : "R") + (i + 1).ToString(System.Globalization.CultureInfo.InvariantCulture).PadLeft(digits, '0');
    }

    /// <summary>The catalogue as a <see cref="CatalogueRows"/> (angles in radians), as if loaded from a file.</summary>
    public CatalogueRows ToSample(string sourceName = "mock")
    {
        var rows = Enumerable.Range(1, Count).Select(i => (long)i).ToArray();
        var rad = new double[Count];
        var radErr = new double[Count];
        for (int i = 0; i < Count; i++)
        {
            rad[i] = ThetaArcsec[i] * AngleUnits.RadiansPerArcsec;
            radErr[i] = ThetaErrArcsec[i] * AngleUnits.RadiansPerArcsec;
        }
        return new CatalogueRows(sourceName, rows, Z, id: Enumerable.Range(0, Count).Select(Id).ToArray(), zErr: ZErr,
            thetaRad: rad, thetaErrRad: radErr, mu: Mu, muErr: MuErr, mag: Mag,
            sizeDefinition: Spec.Design.Kind == MockObjectKind.Galaxy ? SizeDefinition.Effective : new SizeDefinition(SizeKind.GaussianFwhm),
            survey: new SurveyColumns(FluxDensityJy: FluxDensityJy, Group: Group));
    }

    /// <summary>
    /// The catalogue as the fitter's <see cref="Observables"/> directly (ln θ in radians with error θ_err/θ, μ, μ_err),
    /// without building ids: the fast path of the power analysis.
    /// </summary>
    public Observables ToObservables()
    {
        var lnTheta = new double[Count];
        var lnErr = new double[Count];
        double lnScale = Math.Log(AngleUnits.RadiansPerArcsec);
        for (int i = 0; i < Count; i++)
        {
            lnTheta[i] = Math.Log(ThetaArcsec[i]) + lnScale;
            lnErr[i] = ThetaErrArcsec[i] / ThetaArcsec[i];
        }
        LuminosityData? lum = FluxDensityJy is { } s ? new LuminosityData(LuminosityKind.FluxDensity, s, SpectralIndex: Spec.SurveyTruth.RadioSpectralIndex)
            : TrueAbsMag is not null ? new LuminosityData(LuminosityKind.ApparentMagnitude, Mag!) : null;
        return new Observables(Z, lnTheta, lnErr, Mu, MuErr, mag: Mag,
            sizeDefinition: Spec.Design.Kind == MockObjectKind.Galaxy ? SizeDefinition.Effective : new SizeDefinition(SizeKind.GaussianFwhm),
            survey: new SurveyObservables(ZErr, lum, Group: Group, CompactRadioSources: FluxDensityJy is not null));
    }

    /// <summary>
    /// The catalogue as a table for the writers, columns named by role so that <c>fit</c> reads it with no mapping:
    /// <c>id, z, [z_err], theta, theta_err, [mu, mu_err, mag], [group]</c> (galaxies) or <c>id, z, [z_err], theta, theta_err, log_lum,
    /// flux_density</c> (radio). θ is in arcsec, or in mas when <paramref name="thetaInMas"/> (for FITS and VOTable, whose columns carry
    /// units; CSV has no units, so θ stays in arcsec there).
    /// </summary>
    public CatalogueTable ToTable(string? name = null, bool thetaInMas = false)
    {
        var t = new CatalogueTable(name);
        t.AddText("id", Enumerable.Range(0, Count).Select(Id).ToArray(), "meta.id;meta.main", "synthetic object identifier");
        t.AddReal("z", Z, null, "src.redshift", Spec.Design.MeasurementErrors.PhotoZError > 0 ? "photometric redshift (synthetic)" : "redshift (synthetic)");
        if (ZErr is { } ze) t.AddReal("z_err", ze, null, "stat.error;src.redshift", "redshift error");
        double f = thetaInMas ? 1000.0 : 1.0;
        string unit = thetaInMas ? "mas" : "arcsec";
        bool galaxy = Spec.Design.Kind == MockObjectKind.Galaxy;
        t.AddReal("theta", ThetaArcsec.Select(v => v * f).ToArray(), unit, "phys.angSize;src", galaxy ? "effective (half-light) radius" : "VLBI core angular size");
        t.AddReal("theta_err", ThetaErrArcsec.Select(v => v * f).ToArray(), unit, "stat.error;phys.angSize;src", "angular-size error");
        if (Mu is { } mu) t.AddReal("mu", mu, "mag.arcsec-2", "phot.mag.sb", "mean surface brightness within the effective radius");
        if (MuErr is { } mue) t.AddReal("mu_err", mue, "mag.arcsec-2", "stat.error;phot.mag.sb", "surface-brightness error");
        if (Mag is { } mag) t.AddReal("mag", mag, "mag", "phot.mag", "total magnitude, mu - 2.5 log10(2 pi theta^2)");
        if (LogLuminosity is { } ll) t.AddReal("log_lum", ll, "log(W/Hz)", "phys.luminosity;em.radio", "log10 radio luminosity (in the true world model)");
        if (FluxDensityJy is { } fd) t.AddReal("flux_density", fd, "Jy", "phot.flux.density;em.radio", "radio flux density");
        if (Group is { } gr) t.AddText("group", gr, "src.class", "population label");
        return t;
    }
}

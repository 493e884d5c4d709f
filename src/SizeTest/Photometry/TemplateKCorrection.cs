namespace SizeTest.Photometry;

/// <summary>
/// K-correction of a spectral template observed through band R and referred to rest-frame
/// band Q (Hogg, Baldry, Blanton &amp; Eisenstein 2002, astro-ph/0210394, eq. 8; m_R = M_Q + DM + K_QR is their eq. 2):
/// <code>
/// K_QR(z) = −2.5 log10 { (1+z) ∫ L_ν((1+z)ν_o) R(ν_o) dν_o/ν_o · ∫ g^Q_ν(ν_e) Q(ν_e) dν_e/ν_e
///                       / [ ∫ g^R_ν(ν_o) R(ν_o) dν_o/ν_o · ∫ L_ν(ν_e) Q(ν_e) dν_e/ν_e ] }
/// </code>
/// with photon-counting responses R, Q (see <see cref="FilterResponse"/>) and reference spectra
/// g (AB: flat 3631 Jy; or a user-supplied Vega-like spectrum in cgs). The explicit (1+z) is the
/// bandwidth factor of per-frequency photometry and is counted exactly once; L_ν((1+z)ν_o) is the
/// template evaluated at the rest wavelength λ_o/(1+z). Integrals run in ln λ (dν/ν = dλ/λ) by
/// composite Simpson on a merged grid of filter and shifted template nodes.
/// </summary>
/// <remarks>Usage in SizeTest: μ_obs,R = μ_rest,Q + 2.5 n_bol log10(1+z) + K_QR(z).</remarks>
public sealed class TemplateKCorrection
{
    private readonly SpectralTable _template;
    private readonly FilterResponse _observed;
    private readonly FilterResponse _rest;
    private readonly double _lnRestRatio; // ln[ ∫ g^Q Q / (∫ g^R R · ∫ L Q) ], z-independent
    private readonly List<double> _points = new();

    /// <summary>Prepares the z-independent integrals.</summary>
    /// <param name="template">Rest-frame spectrum L (any normalisation).</param>
    /// <param name="observedBand">Observed band R.</param>
    /// <param name="restBand">Rest-frame band Q.</param>
    /// <param name="observedReference">Reference g^R of the observed magnitudes (null = AB).</param>
    /// <param name="restReference">Reference g^Q of the rest-frame magnitudes (null = AB).</param>
    /// <exception cref="ArgumentException">A reference does not cover its band, or the template does not cover Q.</exception>
    public TemplateKCorrection(SpectralTable template, FilterResponse observedBand, FilterResponse restBand,
        SpectralTable? observedReference = null, SpectralTable? restReference = null)
    {
        _template = template ?? throw new ArgumentNullException(nameof(template));
        _observed = observedBand ?? throw new ArgumentNullException(nameof(observedBand));
        _rest = restBand ?? throw new ArgumentNullException(nameof(restBand));
        ObservedReference = observedReference ?? SpectralTable.AbReference;
        RestReference = restReference ?? SpectralTable.AbReference;
        Require(ObservedReference, _observed, "observed-band reference");
        Require(RestReference, _rest, "rest-frame-band reference");
        Require(template, _rest, "template (rest-frame band)");

        double refQ = BandIntegral(RestReference, _rest, 1.0);
        double refR = BandIntegral(ObservedReference, _observed, 1.0);
        double lQ = BandIntegral(template, _rest, 1.0);
        if (!(refQ > 0) || !(refR > 0) || !(lQ > 0))
            throw new ArgumentException($"{template.Source}: a band integral is zero (template or reference has no flux in the band).");
        _lnRestRatio = Math.Log(refQ) - Math.Log(refR) - Math.Log(lQ);
        MaxRedshift = _observed.MinLambdaAngstrom / template.MinLambdaAngstrom - 1.0;
        MinRedshift = Math.Max(0.0, _observed.MaxLambdaAngstrom / template.MaxLambdaAngstrom - 1.0);
    }

    /// <summary>Reference spectrum of the observed band.</summary>
    public SpectralTable ObservedReference { get; }

    /// <summary>Reference spectrum of the rest-frame band.</summary>
    public SpectralTable RestReference { get; }

    /// <summary>Smallest redshift at which the template covers the observed band's rest wavelengths.</summary>
    public double MinRedshift { get; }

    /// <summary>Largest redshift at which the template covers the observed band's rest wavelengths.</summary>
    public double MaxRedshift { get; }

    /// <summary>
    /// K_QR(z) in mag. False (NaN) when the template does not cover λ_R/(1+z) over the observed
    /// band or the template has no flux there. Not thread-safe (reuses a work list).
    /// </summary>
    public bool TryEvaluate(double z, out double kMag)
    {
        kMag = double.NaN;
        if (!(z > -1.0) || z < MinRedshift - 1e-12 || z > MaxRedshift + 1e-12) return false;
        double onePlusZ = 1.0 + z;
        double num = BandIntegral(_template, _observed, onePlusZ);
        if (!(num > 0)) return false;
        kMag = -2.5 / Math.Log(10.0) * (Math.Log(onePlusZ) + Math.Log(num) + _lnRestRatio);
        return true;
    }

    /// <summary>K_QR(z) in mag; throws where <see cref="TryEvaluate"/> fails.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The template does not cover the needed rest wavelengths.</exception>
    public double Evaluate(double z) =>
        TryEvaluate(z, out var k) ? k
        : throw new ArgumentOutOfRangeException(nameof(z), z,
            $"{_template.Source} does not cover the rest wavelengths of band {_observed.Name} at z = {z} (usable for {MinRedshift:G4} ≤ z ≤ {MaxRedshift:G4}).");

    /// <summary>
    /// ∫ S_ν(λ/s) B(λ) dλ/λ over the band: for s = 1+z the spectrum is seen red-shifted (its rest
    /// wavelength is λ/s); for s = 1 it is evaluated in place.
    /// </summary>
    private double BandIntegral(SpectralTable s, FilterResponse band, double shift)
    {
        _points.Clear();
        double lo = band.MinLambdaAngstrom, hi = band.MaxLambdaAngstrom;
        _points.Add(lo);
        _points.Add(hi);
        foreach (var l in band.LambdaAngstrom) if (l > lo && l < hi) _points.Add(l);
        foreach (var l in s.LambdaAngstrom)
        {
            double lo2 = l * shift;
            if (lo2 > lo && lo2 < hi) _points.Add(lo2);
        }
        return LogLambdaIntegrator.IntegrateSorted(lam => s.FNuAt(lam / shift) * band.ResponseAt(lam), _points);
    }

    private static void Require(SpectralTable s, FilterResponse band, string what)
    {
        if (!s.Covers(band.MinLambdaAngstrom, band.MaxLambdaAngstrom))
            throw new ArgumentException(
                $"{s.Source}: the {what} spans {s.MinLambdaAngstrom:G6}–{s.MaxLambdaAngstrom:G6} Å but band {band.Name} needs {band.MinLambdaAngstrom:G6}–{band.MaxLambdaAngstrom:G6} Å.");
    }
}

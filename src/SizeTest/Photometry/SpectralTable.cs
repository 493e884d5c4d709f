namespace SizeTest.Photometry;

/// <summary>Whether a spectrum's values are per unit frequency (f_ν) or per unit wavelength (f_λ).</summary>
public enum SpectralDensity
{
    /// <summary>Flux density per unit frequency, f_ν (for references: erg s⁻¹ cm⁻² Hz⁻¹).</summary>
    PerFrequency,
    /// <summary>Flux density per unit wavelength, f_λ (for references: erg s⁻¹ cm⁻² Å⁻¹).</summary>
    PerWavelength,
}

/// <summary>
/// A tabulated spectrum: wavelengths in Å (strictly increasing, &gt; 0) and flux densities
/// (≥ 0). Evaluated as f_ν by interpolation linear in (ln λ, ln f) between positive
/// neighbours — exact for power laws — and linear in ln λ where a neighbour is zero.
/// f_λ tables are converted with f_ν = f_λ λ²/c (c in Å/s). Outside the table the
/// spectrum is undefined (NaN); K-corrections check coverage first.
/// </summary>
/// <remarks>
/// A template's normalisation cancels in every K-correction; a reference spectrum's does not
/// when the observed and rest-frame references differ, so references must be in cgs units.
/// </remarks>
public sealed class SpectralTable
{
    /// <summary>Speed of light in Å/s (CODATA 2018: c = 299 792 458 m/s exactly).</summary>
    public const double SpeedOfLightAngstromPerSecond = 2.99792458e18;

    /// <summary>AB zero-point flux density: 3631 Jy = 3.631e−20 erg s⁻¹ cm⁻² Hz⁻¹ (Oke &amp; Gunn 1983, ApJ 266, 713: m_AB = −2.5 log10 f_ν − 48.60).</summary>
    public const double AbFluxDensityCgs = 3.631e-20;

    private readonly double[] _lnLambda;
    private readonly double[] _fnu;
    private readonly double[] _lnFnu;

    private SpectralTable(double[] lambda, double[] fnu, string source)
    {
        LambdaAngstrom = lambda;
        _fnu = fnu;
        _lnLambda = new double[lambda.Length];
        _lnFnu = new double[lambda.Length];
        for (int i = 0; i < lambda.Length; i++)
        {
            _lnLambda[i] = Math.Log(lambda[i]);
            _lnFnu[i] = fnu[i] > 0 ? Math.Log(fnu[i]) : double.NegativeInfinity;
        }
        Source = source;
    }

    /// <summary>Table wavelengths in Å.</summary>
    public IReadOnlyList<double> LambdaAngstrom { get; }

    /// <summary>Where the table came from (file name or a description), for messages and the manifest.</summary>
    public string Source { get; }

    /// <summary>Shortest tabulated wavelength, Å.</summary>
    public double MinLambdaAngstrom => LambdaAngstrom[0];

    /// <summary>Longest tabulated wavelength, Å.</summary>
    public double MaxLambdaAngstrom => LambdaAngstrom[^1];

    /// <summary>
    /// Builds a spectrum from columns already read.
    /// </summary>
    /// <param name="lambdaAngstrom">Wavelengths in Å, strictly increasing, &gt; 0, at least 2.</param>
    /// <param name="flux">Flux densities ≥ 0 (finite), same length.</param>
    /// <param name="density">Whether <paramref name="flux"/> is f_ν or f_λ.</param>
    /// <param name="source">Name for messages.</param>
    /// <exception cref="ArgumentException">The columns violate the rules above (message names the index).</exception>
    public static SpectralTable FromColumns(double[] lambdaAngstrom, double[] flux, SpectralDensity density, string source = "spectrum")
    {
        ArgumentNullException.ThrowIfNull(lambdaAngstrom);
        ArgumentNullException.ThrowIfNull(flux);
        TableChecks.CheckGrid(lambdaAngstrom, flux, source, "flux");
        var fnu = new double[flux.Length];
        for (int i = 0; i < flux.Length; i++)
            fnu[i] = density == SpectralDensity.PerFrequency
                ? flux[i]
                : flux[i] * lambdaAngstrom[i] * lambdaAngstrom[i] / SpeedOfLightAngstromPerSecond;
        bool any = false;
        foreach (var f in fnu) any |= f > 0;
        if (!any) throw new ArgumentException($"{source}: the spectrum is zero everywhere.");
        return new SpectralTable((double[])lambdaAngstrom.Clone(), fnu, source);
    }

    /// <summary>
    /// f_ν = C ν^α between two wavelengths, represented exactly by two nodes (log–log
    /// interpolation is exact for a power law). C is 1 at λ = 1 Å.
    /// </summary>
    public static SpectralTable PowerLaw(double alpha, double minLambdaAngstrom = 1.0, double maxLambdaAngstrom = 1e9)
    {
        // ν^α ∝ λ^−α
        double[] l = [minLambdaAngstrom, maxLambdaAngstrom];
        double[] f = [Math.Pow(minLambdaAngstrom, -alpha), Math.Pow(maxLambdaAngstrom, -alpha)];
        return FromColumns(l, f, SpectralDensity.PerFrequency, $"power law f_nu ~ nu^{alpha.ToString("G6", System.Globalization.CultureInfo.InvariantCulture)}");
    }

    /// <summary>The AB reference spectrum: flat f_ν = 3631 Jy from 1 Å to 10⁹ Å (Oke &amp; Gunn 1983).</summary>
    public static SpectralTable AbReference { get; } =
        FromColumns([1.0, 1e9], [AbFluxDensityCgs, AbFluxDensityCgs], SpectralDensity.PerFrequency, "AB (flat f_nu = 3631 Jy)");

    /// <summary>Whether the table covers [lo, hi] (Å).</summary>
    public bool Covers(double loAngstrom, double hiAngstrom) =>
        loAngstrom >= MinLambdaAngstrom * (1 - 1e-12) && hiAngstrom <= MaxLambdaAngstrom * (1 + 1e-12);

    /// <summary>f_ν at <paramref name="lambdaAngstrom"/>; NaN outside the table.</summary>
    public double FNuAt(double lambdaAngstrom)
    {
        double x = Math.Log(lambdaAngstrom);
        var ll = _lnLambda;
        int n = ll.Length;
        if (x < ll[0])
        {
            if (x > ll[0] - 1e-12) return _fnu[0];
            return double.NaN;
        }
        if (x > ll[n - 1])
        {
            if (x < ll[n - 1] + 1e-12) return _fnu[n - 1];
            return double.NaN;
        }
        int i = Array.BinarySearch(ll, x);
        if (i >= 0) return _fnu[i];
        int hi = ~i, lo = hi - 1;
        double t = (x - ll[lo]) / (ll[hi] - ll[lo]);
        if (_fnu[lo] > 0 && _fnu[hi] > 0)
            return Math.Exp(_lnFnu[lo] + t * (_lnFnu[hi] - _lnFnu[lo]));
        return _fnu[lo] + t * (_fnu[hi] - _fnu[lo]);
    }
}

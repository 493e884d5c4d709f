namespace SizeTest.Photometry;

/// <summary>
/// K-corrections of a power-law spectrum f_ν ∝ ν^α in closed form, in the convention of
/// Hogg, Baldry, Blanton &amp; Eisenstein 2002 (astro-ph/0210394): m_R = M_Q + DM + K_QR, so K is
/// added to the model's apparent (surface) brightness, and it contains the (1+z)
/// bandwidth factor of per-frequency (AB) photometry exactly once.
/// </summary>
public static class PowerLawKCorrection
{
    /// <summary>
    /// Same observed and rest-frame band (R = Q in Hogg et al. 2002 eq. 8): K = −2.5 log10[(1+z) L_ν((1+z)ν)/L_ν(ν)]
    /// = −2.5 (1+α) log10(1+z) (closed form for a power law; exact for any
    /// filter curve). α = 0 (flat f_ν) gives −2.5 log10(1+z), α = −2 (flat f_λ) gives +2.5 log10(1+z).
    /// </summary>
    public static double SameBand(double alpha, double z) => -2.5 * (1.0 + alpha) * Math.Log10(1.0 + z);

    /// <summary>
    /// Observed band R at wavelength λ_R, rest-frame band Q at λ_Q, both narrow and AB
    /// (Hogg et al. 2002 eq. 8 with delta-function filters):
    /// K_QR = −2.5 log10(1+z) − 2.5 α log10[(1+z) λ_Q / λ_R].
    /// Reduces to <see cref="SameBand"/> for λ_R = λ_Q and to the bandwidth term −2.5 log10(1+z)
    /// alone when λ_R = (1+z) λ_Q.
    /// </summary>
    /// <param name="alpha">Spectral index α of f_ν ∝ ν^α.</param>
    /// <param name="z">Redshift.</param>
    /// <param name="observedLambdaAngstrom">Effective wavelength of the observed band, Å.</param>
    /// <param name="restLambdaAngstrom">Effective wavelength of the rest-frame band, Å.</param>
    public static double BetweenBands(double alpha, double z, double observedLambdaAngstrom, double restLambdaAngstrom) =>
        -2.5 * Math.Log10(1.0 + z) - 2.5 * alpha * Math.Log10((1.0 + z) * restLambdaAngstrom / observedLambdaAngstrom);
}

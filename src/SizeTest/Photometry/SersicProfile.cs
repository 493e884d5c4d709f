using MathNet.Numerics;

namespace SizeTest.Photometry;

/// <summary>
/// The Sérsic surface-brightness profile I(R) = I_e exp{−b_n [(R/R_e)^{1/n} − 1]}, in
/// magnitudes μ(R) = μ_e + (2.5 b_n / ln 10) [(R/R_e)^{1/n} − 1] (Graham &amp; Driver 2005,
/// PASA 22, 118, eqs. 1 and 5), and the relations between its surface-brightness measures.
/// </summary>
/// <remarks>
/// b_n is defined so that R_e encloses half of the total light: γ(2n, b_n) = Γ(2n)/2
/// (Graham &amp; Driver 2005, eq. 4; Ciotti &amp; Bertin 1999, A&amp;A 352, 447). It is solved
/// numerically here (inverse regularised incomplete gamma, then Newton polishing), never
/// tabulated. Valid Sérsic indices: 0.05 ≤ n ≤ 50.
/// </remarks>
public static class SersicProfile
{
    /// <summary>Smallest Sérsic index accepted.</summary>
    public const double MinIndex = 0.05;

    /// <summary>Largest Sérsic index accepted.</summary>
    public const double MaxIndex = 50.0;

    /// <summary>2.5 / ln 10 = 2.5 log10(e) ≈ 1.0857: magnitudes per e-fold of intensity.</summary>
    public const double MagnitudesPerEFold = 2.5 / 2.302585092994046;

    /// <summary>Whether <paramref name="sersicN"/> is an accepted Sérsic index.</summary>
    public static bool IsValidIndex(double sersicN) => sersicN >= MinIndex && sersicN <= MaxIndex;

    /// <summary>
    /// b_n from the exact half-light condition P(2n, b_n) = 1/2, P the regularised lower
    /// incomplete gamma function (Graham &amp; Driver 2005, eq. 4). b_1 ≈ 1.678, b_4 ≈ 7.669.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">n outside [<see cref="MinIndex"/>, <see cref="MaxIndex"/>].</exception>
    public static double Bn(double sersicN)
    {
        if (!IsValidIndex(sersicN))
            throw new ArgumentOutOfRangeException(nameof(sersicN), sersicN, $"Sérsic index must lie in [{MinIndex}, {MaxIndex}].");
        double a = 2.0 * sersicN;
        double b = SpecialFunctions.GammaLowerRegularizedInv(a, 0.5);
        if (!(b > 0) || double.IsNaN(b)) b = Math.Max(2.0 * sersicN - 1.0 / 3.0, 1e-3);
        // Newton polishing on f(b) = P(a, b) − 1/2, f'(b) = b^{a−1} e^{−b} / Γ(a).
        double lnGammaA = SpecialFunctions.GammaLn(a);
        for (int it = 0; it < 50; it++)
        {
            double f = SpecialFunctions.GammaLowerRegularized(a, b) - 0.5;
            double df = Math.Exp((a - 1.0) * Math.Log(b) - b - lnGammaA);
            double step = f / df;
            double next = b - step;
            if (next <= 0) next = 0.5 * b;
            b = next;
            if (Math.Abs(step) <= 1e-15 * b) break;
        }
        return b;
    }

    /// <summary>
    /// ⟨μ⟩_e − μ_e = −2.5 log10[ n e^{b_n} Γ(2n) / b_n^{2n} ] (mag): mean surface brightness
    /// within R_e minus the surface brightness at R_e (Graham &amp; Driver 2005, eqs. 8–9).
    /// Negative: the mean inside R_e is brighter than the value at R_e.
    /// </summary>
    public static double MeanMinusEffective(double sersicN)
    {
        double b = Bn(sersicN);
        double lnF = Math.Log(sersicN) + b + SpecialFunctions.GammaLn(2.0 * sersicN) - 2.0 * sersicN * Math.Log(b);
        return -2.5 * lnF / Math.Log(10.0);
    }

    /// <summary>
    /// μ_0 − μ_e = −2.5 b_n / ln 10 (mag): central surface brightness minus the value at R_e
    /// (Graham &amp; Driver 2005, eq. 7 with R = 0).
    /// </summary>
    public static double CentralMinusEffective(double sersicN) => -MagnitudesPerEFold * Bn(sersicN);

    /// <summary>
    /// Fraction of the total light inside R = x R_e: L(&lt;R)/L_tot = P(2n, b_n x^{1/n})
    /// (Graham &amp; Driver 2005, eq. 2 over eq. 3). Equals 1/2 at x = 1 by construction of b_n.
    /// </summary>
    /// <param name="sersicN">Sérsic index.</param>
    /// <param name="radiusOverEffective">x = R/R_e ≥ 0.</param>
    public static double EnclosedLightFraction(double sersicN, double radiusOverEffective)
    {
        if (radiusOverEffective < 0 || double.IsNaN(radiusOverEffective))
            throw new ArgumentOutOfRangeException(nameof(radiusOverEffective), radiusOverEffective, "R/R_e must be ≥ 0.");
        double b = Bn(sersicN);
        return SpecialFunctions.GammaLowerRegularized(2.0 * sersicN, b * Math.Pow(radiusOverEffective, 1.0 / sersicN));
    }

    /// <summary>
    /// Surface brightness at R = x R_e: μ(R) = μ_e + (2.5 b_n/ln 10)[x^{1/n} − 1]
    /// (Graham &amp; Driver 2005, eq. 5). Mag/arcsec² in the same system as <paramref name="muEffective"/>.
    /// </summary>
    public static double SurfaceBrightnessAt(double sersicN, double muEffective, double radiusOverEffective) =>
        muEffective + MagnitudesPerEFold * Bn(sersicN) * (Math.Pow(radiusOverEffective, 1.0 / sersicN) - 1.0);
}

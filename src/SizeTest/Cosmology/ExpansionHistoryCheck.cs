using System.Globalization;

namespace SizeTest.Cosmology;

/// <summary>
/// Decides whether a parameter set has a big bang: E²(z) = H²/H0² must stay &gt; 0 for every
/// past redshift 0 ≤ z ≤ <see cref="FlrwModel.MaxRedshift"/>. Where E² reaches 0 at some
/// z* &gt; 0 the universe bounced there (no big bang) and no light reaches us from z &gt; z*;
/// such sets are refused outright, whatever redshift is asked for. (A recollapse in the
/// future, z &lt; 0, does not affect past distances and is allowed.)
/// </summary>
internal static class ExpansionHistoryCheck
{
    /// <summary>
    /// Exact check for E² = Ωr y⁴ + Ωm y³ + Ωk y² + ΩΛ, y = 1+z ≥ 1, with Ωr, Ωm ≥ 0: E²(1) = 1,
    /// so E² can only vanish beyond a stationary point y* &gt; 1 (roots of 4Ωr y² + 3Ωm y + 2Ωk = 0)
    /// with E²(y*) ≤ 0, or at large y when Ωr = Ωm = 0 and Ωk &lt; 0.
    /// </summary>
    /// <returns>The redshift where E² first reaches 0, or null when E² &gt; 0 throughout.</returns>
    public static double? PolynomialZero(double omegaR, double omegaM, double omegaK, double omegaL)
    {
        double P(double y) => ((omegaR * y + omegaM) * y + omegaK) * y * y + omegaL;
        Span<double> candidates = stackalloc double[3];
        int n = 0;
        if (omegaR > 0)
        {
            double disc = 9 * omegaM * omegaM - 32 * omegaR * omegaK;
            if (disc >= 0)
            {
                double sq = Math.Sqrt(disc);
                candidates[n++] = (-3 * omegaM + sq) / (8 * omegaR);
                candidates[n++] = (-3 * omegaM - sq) / (8 * omegaR);
            }
        }
        else if (omegaM > 0) candidates[n++] = -2 * omegaK / (3 * omegaM);
        else if (omegaK < 0) candidates[n++] = MaxY;
        double yMax = MaxY;
        double? first = null;
        for (int i = 0; i < n; i++)
        {
            double y = Math.Min(candidates[i], yMax);
            if (y > 1 && P(y) <= 0)
            {
                double z = Bisect(P, 1.0, y) - 1.0;
                if (first is null || z < first) first = z;
            }
        }
        if (first is null && P(yMax) <= 0) first = Bisect(P, 1.0, yMax) - 1.0;
        return first;
    }

    /// <summary>
    /// Sampled check for a general E²(x), x = ln(1+z), at steps of 0.04 in x over the whole
    /// valid range. Sums of a few exponentials cannot dip below zero between samples unless
    /// they come within rounding of zero, which the table builder also detects.
    /// </summary>
    /// <returns>The redshift where E² first reaches ≤ 0, or null.</returns>
    public static double? SampledZero(Func<double, double> e2OfX)
    {
        double xMax = Math.Log(MaxY);
        const double step = 0.04;
        double prev = 0;
        for (double x = 0; ; x += step)
        {
            double xx = Math.Min(x, xMax);
            double v = e2OfX(xx);
            if (!(v > 0))
            {
                double lo = prev, hi = xx;
                for (int i = 0; i < 60; i++)
                {
                    double mid = 0.5 * (lo + hi);
                    if (e2OfX(mid) > 0) lo = mid; else hi = mid;
                }
                return Math.Exp(hi) - 1.0;
            }
            prev = xx;
            if (xx >= xMax) return null;
        }
    }

    /// <summary>The standard refusal message.</summary>
    public static string NoBigBangMessage(string model, string parameters, double z)
        => string.Create(CultureInfo.InvariantCulture,
            $"World model '{model}' with {parameters} has no big bang: H(z)² falls to zero at z ≈ {z:G4} (the universe bounces there), so it cannot describe sources beyond it; lower omega_lambda or raise omega_m.");

    private const double MaxY = 1.0 + FlrwModel.MaxRedshift;

    private static double Bisect(Func<double, double> p, double lo, double hi)
    {
        for (int i = 0; i < 200 && hi - lo > 1e-12 * hi; i++)
        {
            double mid = 0.5 * (lo + hi);
            if (p(mid) > 0) lo = mid; else hi = mid;
        }
        return hi;
    }
}

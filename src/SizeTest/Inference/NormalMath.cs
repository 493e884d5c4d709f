using MathNet.Numerics;

namespace SizeTest.Inference;

/// <summary>Numerically stable Gaussian log-CDFs for truncated likelihoods.</summary>
public static class NormalMath
{
    private const double Sqrt2 = 1.4142135623730951;
    private const double LnSqrt2Pi = 0.91893853320467274;

    /// <summary>Standard normal CDF Φ(x) = ½ erfc(−x/√2).</summary>
    public static double Phi(double x) => 0.5 * SpecialFunctions.Erfc(-x / Sqrt2);

    /// <summary>
    /// ln Φ(x), accurate over the whole real line: ln(½ erfc(−x/√2)) for x &gt; −30, log1p(−½ erfc(x/√2)) for
    /// x &gt; 5, and the asymptotic series ln Φ(x) ≈ −x²/2 − ln(−x) − ln√(2π) + ln(1 − 1/x² + 3/x⁴ − 15/x⁶)
    /// (Abramowitz &amp; Stegun 1964, 26.2.12) below −30.
    /// </summary>
    public static double LogPhi(double x)
    {
        if (double.IsNaN(x)) return double.NaN;
        if (x > 5)
        {
            double t = 0.5 * SpecialFunctions.Erfc(x / Sqrt2); // t < 3e-7, so log1p(−t) = −t − t²/2 to 1e-20
            return -t - 0.5 * t * t;
        }
        if (x > -30) return Math.Log(0.5 * SpecialFunctions.Erfc(-x / Sqrt2));
        double x2 = 1.0 / (x * x);
        return -0.5 * x * x - Math.Log(-x) - LnSqrt2Pi + Math.Log(1 - x2 + 3 * x2 * x2 - 15 * x2 * x2 * x2);
    }

    /// <summary>
    /// d ln Φ(x)/dx = φ(x)/Φ(x) (the inverse Mills ratio of −x), computed as exp(ln φ(x) − ln Φ(x)) with the stable
    /// <see cref="LogPhi"/>, so it tends to −x for x → −∞ and to 0 for x → +∞.
    /// </summary>
    public static double LogPhiDerivative(double x)
    {
        if (double.IsNaN(x)) return double.NaN;
        if (x > 38) return 0;
        return Math.Exp(-0.5 * x * x - LnSqrt2Pi - LogPhi(x));
    }

    /// <summary>Standard bivariate normal density φ₂(h, k; ρ) = exp(−(h² − 2ρhk + k²)/(2(1−ρ²))) / (2π√(1−ρ²)).</summary>
    public static double BivariateDensity(double h, double k, double rho)
    {
        double om = (1 - rho) * (1 + rho);
        return Math.Exp(-(h * h - 2 * rho * h * k + k * k) / (2 * om)) / (2 * Math.PI * Math.Sqrt(om));
    }

    /// <summary>
    /// ln Φ₂(h, k; ρ) as <see cref="LogBivariatePhi(double, double, double)"/>, with its partial derivatives from the closed forms
    /// ∂Φ₂/∂h = φ(h) Φ((k − ρh)/√(1−ρ²)), ∂Φ₂/∂k = φ(k) Φ((h − ρk)/√(1−ρ²)) and ∂Φ₂/∂ρ = φ₂(h, k; ρ)
    /// (Plackett 1954; e.g. Genz &amp; Bretz 2009 §2.1), each divided by Φ₂. In the deep tail where the probability
    /// underflows the derivatives are those of the univariate bound used for the value.
    /// </summary>
    public static double LogBivariatePhi(double h, double k, double rho, out double dh, out double dk, out double drho)
    {
        double p = BivariatePhi(h, k, rho);
        if (p > 1e-280 && Math.Abs(rho) < 1)
        {
            double sq = Math.Sqrt((1 - rho) * (1 + rho));
            const double InvSqrt2Pi = 0.3989422804014327;
            dh = InvSqrt2Pi * Math.Exp(-0.5 * h * h) * Phi((k - rho * h) / sq) / p;
            dk = InvSqrt2Pi * Math.Exp(-0.5 * k * k) * Phi((h - rho * k) / sq) / p;
            drho = BivariateDensity(h, k, rho) / p;
            return Math.Log(p);
        }
        dh = dk = drho = 0;
        double lh = LogPhi(h), lk = LogPhi(k), value;
        if (lh <= lk) { value = lh; dh = LogPhiDerivative(h); }
        else { value = lk; dk = LogPhiDerivative(k); }
        if (rho < 0)
        {
            double mx = Math.Max(h, k);
            value += LogPhi(mx);
            if (h >= k) dh += LogPhiDerivative(mx); else dk += LogPhiDerivative(mx);
        }
        return value;
    }

    // Gauss–Legendre nodes/weights on [−1, 1] (positive half), 6, 12 and 20 points (Abramowitz & Stegun 1964, Table 25.4).
    private static readonly double[] W6 = [0.1713244923791705, 0.3607615730481384, 0.4679139345726904];
    private static readonly double[] X6 = [0.9324695142031522, 0.6612093864662647, 0.2386191860831970];
    private static readonly double[] W12 = [0.04717533638651177, 0.1069393259953183, 0.1600783285433464, 0.2031674267230659, 0.2334925365383547, 0.2491470458134029];
    private static readonly double[] X12 = [0.9815606342467191, 0.9041172563704750, 0.7699026741943050, 0.5873179542866171, 0.3678314989981802, 0.1252334085114692];
    private static readonly double[] W20 = [0.01761400713915212, 0.04060142980038694, 0.06267204833410906, 0.08327674157670475, 0.1019301198172404, 0.1181945319615184, 0.1316886384491766, 0.1420961093183821, 0.1491729864726037, 0.1527533871307259];
    private static readonly double[] X20 = [0.9931285991850949, 0.9639719272779138, 0.9122344282513259, 0.8391169718222188, 0.7463319064601508, 0.6360536807265150, 0.5108670019508271, 0.3737060887154196, 0.2277858511416451, 0.07652652113349733];

    /// <summary>
    /// Bivariate standard normal CDF P(X &lt; h, Y &lt; k) with correlation ρ, by the Drezner &amp; Wesolowsky (1990)
    /// method as refined by Genz (2004, Statistics and Computing 14, 251), absolute accuracy ~1e-15.
    /// </summary>
    public static double BivariatePhi(double h, double k, double rho)
    {
        if (rho >= 1) return Phi(Math.Min(h, k));
        if (rho <= -1) return Math.Max(0, Phi(h) - Phi(-k));
        return UpperOrthant(-h, -k, rho);
    }

    /// <summary>ln P(X &lt; h, Y &lt; k) for correlation ρ, falling back to the univariate bound when the probability underflows.</summary>
    public static double LogBivariatePhi(double h, double k, double rho)
    {
        double p = BivariatePhi(h, k, rho);
        if (p > 1e-280) return Math.Log(p);
        // Deep tail: at least one of the two marginals is tiny; the smaller marginal is an upper bound.
        return Math.Min(LogPhi(h), LogPhi(k)) + (rho < 0 ? LogPhi(Math.Max(h, k)) : 0);
    }

    // P(X > h, Y > k), Genz (2004) "bvnu".
    private static double UpperOrthant(double h, double k, double r)
    {
        double[] w, x;
        if (Math.Abs(r) < 0.3) { w = W6; x = X6; }
        else if (Math.Abs(r) < 0.75) { w = W12; x = X12; }
        else { w = W20; x = X20; }
        double hk = h * k, bvn = 0;
        if (Math.Abs(r) < 0.925)
        {
            double hs = (h * h + k * k) / 2, asr = Math.Asin(r);
            for (int i = 0; i < x.Length; i++)
            {
                double sn = Math.Sin(asr * (1 - x[i]) / 2);
                bvn += w[i] * Math.Exp((sn * hk - hs) / (1 - sn * sn));
                sn = Math.Sin(asr * (1 + x[i]) / 2);
                bvn += w[i] * Math.Exp((sn * hk - hs) / (1 - sn * sn));
            }
            return bvn * asr / (4 * Math.PI) + Phi(-h) * Phi(-k);
        }
        if (r < 0) { k = -k; hk = -hk; }
        if (Math.Abs(r) < 1)
        {
            double ass = (1 - r) * (1 + r), a = Math.Sqrt(ass), bs = (h - k) * (h - k);
            double c = (4 - hk) / 8, d = (12 - hk) / 16;
            bvn = a * Math.Exp(-(bs / ass + hk) / 2) * (1 - c * (bs - ass) * (1 - d * bs / 5) / 3 + c * d * ass * ass / 5);
            if (hk > -160)
            {
                double b = Math.Sqrt(bs);
                bvn -= Math.Exp(-hk / 2) * Math.Sqrt(2 * Math.PI) * Phi(-b / a) * b * (1 - c * bs * (1 - d * bs / 5) / 3);
            }
            a /= 2;
            for (int i = 0; i < x.Length; i++)
                for (int s = -1; s <= 1; s += 2)
                {
                    double xs = a * (s * x[i] + 1);
                    xs *= xs;
                    double rs = Math.Sqrt(1 - xs);
                    bvn += a * w[i] * (Math.Exp(-bs / (2 * xs) - hk / (1 + rs)) / rs - Math.Exp(-(bs / xs + hk) / 2) * (1 + c * xs * (1 + d * xs)));
                }
            bvn = -bvn / (2 * Math.PI);
        }
        if (r > 0) return Math.Max(0, bvn + Phi(-Math.Max(h, k)));
        if (h >= k) return Math.Max(0, -bvn);
        double l = h < 0 ? Phi(k) - Phi(h) : Phi(-h) - Phi(-k);
        return Math.Max(0, l - bvn);
    }
}

namespace SizeTest.Cosmology;

/// <summary>
/// Adaptive Gauss–Kronrod (7/15-point) quadrature with interval bisection. It is the
/// reference integration of the world models: slow (hundreds of integrand calls) but
/// accurate to near machine precision for the smooth integrands of FLRW distances.
/// </summary>
/// <remarks>
/// Nodes and weights: Kronrod 1965, as tabulated in QUADPACK (Piessens et al. 1983, qk15).
/// The error estimate of an interval is |K15 − G7|; an interval is accepted when that is below
/// max(absTol, relTol·|total estimate|)·(width/total width).
/// </remarks>
internal static class AdaptiveQuadrature
{
    private static readonly double[] Xk =
    [
        0.991455371120812639206854697526329,
        0.949107912342758524526189684047851,
        0.864864423359769072789712788640926,
        0.741531185599394439863864773280788,
        0.586087235467691130294144845693013,
        0.405845151377397166906606412076961,
        0.207784955007898467600689403773245,
        0.000000000000000000000000000000000,
    ];

    private static readonly double[] Wk =
    [
        0.022935322010529224963732008058970,
        0.063092092629978553290700663189204,
        0.104790010322250183839876322541518,
        0.140653259715525918745189590510238,
        0.169004726639267902826583426598550,
        0.190350578064785409913256402421014,
        0.204432940075298892414161999234649,
        0.209482141084727828012999174891714,
    ];

    // Gauss 7-point weights at the odd Kronrod nodes (indices 1, 3, 5, 7).
    private static readonly double[] Wg =
    [
        0.129484966168869693270611432679082,
        0.279705391489276667901467771423780,
        0.381830050505118944950369775488975,
        0.417959183673469387755102040816327,
    ];

    /// <summary>Integrates <paramref name="f"/> over [a, b] to the given tolerances.</summary>
    public static double Integrate(Func<double, double> f, double a, double b, double relTol = 1e-14, double absTol = 1e-300, int maxDepth = 40)
    {
        if (a == b) return 0.0;
        var (k0, g0) = Rule(f, a, b);
        return Refine(f, a, b, k0, g0, relTol, Math.Max(absTol, relTol * Math.Abs(k0)), b - a, maxDepth);
    }

    private static double Refine(Func<double, double> f, double a, double b, double k, double g, double relTol, double tol, double totalWidth, int depth)
    {
        double allowed = tol * Math.Abs((b - a) / totalWidth);
        if (Math.Abs(k - g) <= allowed || depth == 0 || Math.Abs(k - g) <= 1e-17 * Math.Abs(k)) return k;
        double m = 0.5 * (a + b);
        var (kl, gl) = Rule(f, a, m);
        var (kr, gr) = Rule(f, m, b);
        return Refine(f, a, m, kl, gl, relTol, tol, totalWidth, depth - 1)
             + Refine(f, m, b, kr, gr, relTol, tol, totalWidth, depth - 1);
    }

    private static (double Kronrod, double Gauss) Rule(Func<double, double> f, double a, double b)
    {
        double c = 0.5 * (a + b), h = 0.5 * (b - a);
        double fc = f(c);
        double k = Wk[7] * fc, g = Wg[3] * fc;
        for (int i = 0; i < 7; i++)
        {
            double dx = h * Xk[i];
            double s = f(c - dx) + f(c + dx);
            k += Wk[i] * s;
            if (i % 2 == 1) g += Wg[i / 2] * s;
        }
        return (k * h, g * h);
    }
}

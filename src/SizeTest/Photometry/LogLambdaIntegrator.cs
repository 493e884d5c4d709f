namespace SizeTest.Photometry;

/// <summary>
/// ∫ g(λ) dλ/λ = ∫ g(e^u) du (u = ln λ, so dλ/λ = dν/ν up to sign) by composite Simpson on
/// a merged grid: every breakpoint (filter and template nodes, where the integrand has kinks)
/// starts a new segment, and each segment is split into an even number of equal steps in
/// ln λ no longer than <see cref="MaxStepLn"/>. For smooth pieces the error is O(h⁴).
/// </summary>
internal static class LogLambdaIntegrator
{
    /// <summary>Largest Simpson step in ln λ (2·10⁻³ ≈ 0.2 % in wavelength).</summary>
    public const double MaxStepLn = 2e-3;

    /// <summary>Integrates over [lo, hi] (Å) with the given breakpoints (any order; those outside are ignored).</summary>
    public static double Integrate(Func<double, double> g, IReadOnlyList<double> breakpoints, double lo, double hi)
    {
        if (!(hi > lo)) return 0.0;
        var pts = new List<double>(breakpoints.Count + 2) { lo, hi };
        foreach (var b in breakpoints) if (b > lo && b < hi) pts.Add(b);
        return IntegrateSorted(g, pts);
    }

    /// <summary>Integrates over [min, max] of <paramref name="points"/>, which are sorted in place and used as segment ends.</summary>
    public static double IntegrateSorted(Func<double, double> g, List<double> points)
    {
        points.Sort();
        double total = 0.0;
        for (int s = 0; s + 1 < points.Count; s++)
        {
            double u0 = Math.Log(points[s]), u1 = Math.Log(points[s + 1]);
            double width = u1 - u0;
            if (!(width > 1e-14)) continue;
            int m = (int)Math.Ceiling(width / MaxStepLn);
            if (m < 2) m = 2;
            if ((m & 1) == 1) m++;
            double h = width / m;
            double sum = g(points[s]) + g(points[s + 1]);
            for (int k = 1; k < m; k++)
                sum += ((k & 1) == 1 ? 4.0 : 2.0) * g(Math.Exp(u0 + k * h));
            total += sum * h / 3.0;
        }
        return total;
    }
}

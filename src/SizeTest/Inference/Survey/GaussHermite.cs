namespace SizeTest.Inference.Survey;

/// <summary>
/// Gauss–Hermite quadrature: ∫ f(x) e^{−x²} dx ≈ Σ w_j f(x_j), exact for polynomials of degree ≤ 2m − 1
/// (Abramowitz &amp; Stegun 1964, 25.4.46). Nodes by Newton's method on the orthonormal Hermite recurrence
/// (Press et al., Numerical Recipes 3rd ed., §4.6 <c>gauher</c>).
/// </summary>
public sealed class GaussHermite : QuadratureRule
{
    /// <summary>The m-point rule (1 ≤ m ≤ 100) for the weight function e^{−x²} (the weights sum to √π).</summary>
    public GaussHermite(int m) : base(m, "Gauss–Hermite", Build) { }

    private static (double[] Nodes, double[] Weights) Build(int m)
    {
        var x = new double[m];
        var w = new double[m];
        const double pim4 = 0.7511255444649425; // π^(−1/4)
        double z = 0;
        int half = (m + 1) / 2;
        for (int i = 0; i < half; i++)
        {
            // Initial guesses (Numerical Recipes).
            if (i == 0) z = Math.Sqrt(2.0 * m + 1) - 1.85575 * Math.Pow(2.0 * m + 1, -0.16667);
            else if (i == 1) z -= 1.14 * Math.Pow(m, 0.426) / z;
            else if (i == 2) z = 1.86 * z - 0.86 * x[0];
            else if (i == 3) z = 1.91 * z - 0.91 * x[1];
            else z = 2.0 * z - x[i - 2];
            double pp = 0;
            for (int it = 0; it < 100; it++)
            {
                double p1 = pim4, p2 = 0;
                for (int j = 0; j < m; j++)
                {
                    double p3 = p2;
                    p2 = p1;
                    p1 = z * Math.Sqrt(2.0 / (j + 1)) * p2 - Math.Sqrt((double)j / (j + 1)) * p3;
                }
                pp = Math.Sqrt(2.0 * m) * p2;
                double z1 = z;
                z = z1 - p1 / pp;
                if (Math.Abs(z - z1) <= 1e-15 * Math.Max(1, Math.Abs(z))) break;
            }
            x[i] = z;
            x[m - 1 - i] = -z;
            w[i] = 2.0 / (pp * pp);
            w[m - 1 - i] = w[i];
        }
        Array.Reverse(x);
        Array.Reverse(w);
        return (x, w);
    }
}

namespace SizeTest.Inference.Survey;

/// <summary>
/// Gauss–Legendre quadrature on [−1, 1]: ∫ f(x) dx ≈ Σ w_j f(x_j), the weights summing to 2, exact for polynomials of degree
/// ≤ 2m − 1 (Abramowitz &amp; Stegun 1964, 25.4.29); nodes by Newton's method on the Legendre recurrence (Press et al.,
/// Numerical Recipes 3rd ed., §4.6 <c>gauleg</c>).
/// </summary>
public sealed class GaussLegendre(int m) : QuadratureRule(m, "Gauss–Legendre", Build)
{
    private static (double[] Nodes, double[] Weights) Build(int m)
    {
        double[] x = new double[m], w = new double[m];
        int half = (m + 1) / 2;
        for (int i = 0; i < half; i++)
        {
            double z = Math.Cos(Math.PI * (i + 0.75) / (m + 0.5)), pp = 0;
            for (int it = 0; it < 100; it++)
            {
                double p1 = 1, p2 = 0;
                for (int j = 0; j < m; j++)
                {
                    double p3 = p2;
                    p2 = p1;
                    p1 = ((2.0 * j + 1) * z * p2 - j * p3) / (j + 1);
                }
                pp = m * (z * p1 - p2) / (z * z - 1);
                double z1 = z;
                z = z1 - p1 / pp;
                if (Math.Abs(z - z1) <= 1e-15) break;
            }
            x[i] = -z;
            x[m - 1 - i] = z;
            w[i] = 2.0 / ((1 - z * z) * pp * pp);
            w[m - 1 - i] = w[i];
        }
        return (x, w);
    }
}

namespace SizeTest.Inference;

/// <summary>
/// Central-difference Hessian of a log density at a maximum, with per-parameter steps chosen so that the
/// diagonal second difference changes ln p by about ½ (roughly a 1σ step: large enough to beat rounding,
/// small enough that the quadratic approximation holds), and kept inside the bounds.
/// </summary>
public static class NumericalHessian
{
    /// <summary>Smallest eigenvalue the unit-diagonal curvature matrix may have before the fit counts as degenerate.</summary>
    public const double MinScaledEigenvalue = 1e-3;

    /// <summary>
    /// Computes H_jk = ∂²ln p/∂θ_j∂θ_k at <paramref name="theta"/> for the parameters in <paramref name="active"/>
    /// (others get zero rows). Off-diagonal terms use the four-point formula
    /// [f(+h_j,+h_k) − f(+h_j,−h_k) − f(−h_j,+h_k) + f(−h_j,−h_k)]/(4 h_j h_k) (common practice).
    /// </summary>
    /// <returns>The Hessian and the number of evaluations used.</returns>
    public static (double[,] Hessian, int Evaluations) Compute(ILogDensity f, ReadOnlySpan<double> theta, IReadOnlyList<double> min, IReadOnlyList<double> max, bool[] active)
    {
        int d = theta.Length, evals = 0;
        var x = theta.ToArray();
        double f0 = f.LogDensity(x); evals++;
        var h = new double[d];
        var hess = new double[d, d];
        double Eval(double[] p) { evals++; return f.LogDensity(p); }
        for (int j = 0; j < d; j++)
        {
            if (!active[j]) continue;
            double range = max[j] - min[j];
            double room = Math.Min(x[j] - min[j], max[j] - x[j]);
            double step = Math.Min(Math.Max(1e-3 * Math.Abs(x[j]), 1e-5 * range), 0.9 * room);
            double d2 = 0;
            for (int iter = 0; iter < 6; iter++)
            {
                double sj = x[j];
                x[j] = sj + step; double fp = Eval(x);
                x[j] = sj - step; double fm = Eval(x);
                x[j] = sj;
                d2 = fp + fm - 2 * f0;
                if (!double.IsFinite(d2)) { step *= 0.1; continue; }
                double ad = Math.Abs(d2);
                if (ad > 0.05 && ad < 2) break;
                double scale = ad > 0 ? Math.Sqrt(0.5 / ad) : 10;
                double next = Math.Min(step * Math.Clamp(scale, 0.05, 20), 0.9 * room);
                if (next == step) break;
                step = next;
            }
            h[j] = step;
            hess[j, j] = d2 / (step * step);
        }
        for (int j = 0; j < d; j++)
            for (int k = j + 1; k < d; k++)
            {
                if (!active[j] || !active[k]) continue;
                double sj = x[j], sk = x[k];
                x[j] = sj + h[j]; x[k] = sk + h[k]; double fpp = Eval(x);
                x[k] = sk - h[k]; double fpm = Eval(x);
                x[j] = sj - h[j]; double fmm = Eval(x);
                x[k] = sk + h[k]; double fmp = Eval(x);
                x[j] = sj; x[k] = sk;
                double v = (fpp - fpm - fmp + fmm) / (4 * h[j] * h[k]);
                hess[j, k] = hess[k, j] = v;
            }
        return (hess, evals);
    }

    /// <summary>
    /// Covariance = (−H)⁻¹ over the active parameters, or null when −H is not positive definite
    /// (checked by Cholesky factorisation).
    /// </summary>
    public static double[,]? Covariance(double[,] hessian, bool[] active)
    {
        int d = active.Length;
        var idx = Enumerable.Range(0, d).Where(j => active[j]).ToArray();
        var cov = new double[d, d];
        if (idx.Length == 0) return cov;
        var m = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.Dense(idx.Length, idx.Length, (a, b) => -hessian[idx[a], idx[b]]);
        for (int a = 0; a < idx.Length; a++)
            if (!(m[a, a] > 0) || !double.IsFinite(m[a, a])) return null;
        // Degeneracy: the curvature matrix scaled to unit diagonal must be well conditioned. An exact degeneracy
        // (e.g. r0_kpc with h0 for sizes) leaves a near-zero eigenvalue that finite differences blur to ~1e-4;
        // real correlations of |ρ| ≤ 0.999 keep it above 1e-3 (2-D case: eigenvalues 1 ± ρ).
        var scaled = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.Dense(idx.Length, idx.Length, (a, b) => m[a, b] / Math.Sqrt(m[a, a] * m[b, b]));
        var eig = scaled.Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric).EigenValues;
        if (eig.Min(e => e.Real) < MinScaledEigenvalue) return null;
        MathNet.Numerics.LinearAlgebra.Matrix<double> inv;
        try { inv = m.Cholesky().Solve(MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseIdentity(idx.Length)); }
        catch (ArgumentException) { return null; }
        for (int a = 0; a < idx.Length; a++)
            for (int b = 0; b < idx.Length; b++) cov[idx[a], idx[b]] = inv[a, b];
        return cov;
    }
}

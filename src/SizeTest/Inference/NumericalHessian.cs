using System.Globalization;
using MathNet.Numerics.LinearAlgebra;

namespace SizeTest.Inference;

/// <summary>
/// The one Hessian of SizeTest: H_jk = ∂²ln p/∂θ_j∂θ_k by central differences of the analytic gradient,
/// column k = [∇ln p(θ + h_k e_k) − ∇ln p(θ − h_k e_k)]/(2h_k), then symmetrised, (H + Hᵀ)/2 (common practice;
/// Nocedal &amp; Wright 2006 §8.1). Error O(h²) from truncation plus (gradient rounding)/h.
/// </summary>
/// <remarks>
/// <para>Steps: a first pass with h_k = 10⁻⁴·max(|θ_k|, 10⁻³·range_k) estimates the curvature; the column is then recomputed with
/// h_k = 10⁻³σ_k, σ_k = (−H_kk)^−½ (a thousandth of a standard deviation: truncation ~10⁻⁶ relative, rounding negligible).
/// Where θ_k ± h_k leaves the box the second-order one-sided formula (−3∇(θ) + 4∇(θ ± h) − ∇(θ ± 2h))/(±2h) is used.</para>
/// <para>For a density without an analytic gradient (<see cref="ILogDensity"/> only) the gradient is itself a central
/// difference of values with step 10⁻²·h_k, so the result is the usual four-point second difference.</para>
/// </remarks>
public static class NumericalHessian
{
    /// <summary>
    /// Smallest eigenvalue of the unit-diagonal curvature matrix below which −H counts as singular (a degenerate direction).
    /// The gradient-difference Hessian is accurate to ~10⁻⁶ relative, so 10⁻⁶ separates a real but strong correlation (the
    /// 200k Ωm-free size fit sits at ~10⁻³: pairwise correlation 0.993) from an exact degeneracy such as r0_kpc with h0.
    /// </summary>
    public const double DegenerateScaledEigenvalue = 1e-6;

    /// <summary>
    /// The Hessian at <paramref name="theta"/> for the parameters in <paramref name="active"/> (others: zero rows and columns).
    /// </summary>
    /// <returns>The symmetric Hessian and the number of gradient evaluations used.</returns>
    /// <param name="f">The log density (with an analytic gradient when it implements <see cref="ILogDensityWithGradient"/>).</param>
    /// <param name="theta">The point, usually a maximum.</param>
    /// <param name="min">Lower bounds (−∞ allowed).</param>
    /// <param name="max">Upper bounds (+∞ allowed).</param>
    /// <param name="active">Which parameters to differentiate.</param>
    /// <param name="initialSteps">First-pass steps; default 10⁻⁴·max(|θ_k|, 10⁻³·range_k) for finite ranges, 10⁻³·max(|θ_k|, 1) otherwise.
    /// A step whose stencil meets a non-finite gradient (outside the support) is divided by 4, up to 20 times.</param>
    public static (double[,] Hessian, int Evaluations) Compute(ILogDensity f, ReadOnlySpan<double> theta, IReadOnlyList<double> min, IReadOnlyList<double> max, bool[] active,
        IReadOnlyList<double>? initialSteps = null)
    {
        ArgumentNullException.ThrowIfNull(f);
        int d = theta.Length, evals = 0;
        var x = theta.ToArray();
        var fg = f as ILogDensityWithGradient;
        var hess = new double[d, d];
        var gp = new double[d]; var gm = new double[d]; var g2 = new double[d]; var g0 = new double[d];
        bool haveG0 = false;
        double[] Gradient(double[] p, double[] into, double fdStep)
        {
            evals++;
            if (fg is not null) { fg.LogDensityAndGradient(p, into); return into; }
            CentralGradient(f, p, into, fdStep, min, max);
            return into;
        }
        for (int k = 0; k < d; k++)
        {
            if (!active[k]) continue;
            double range = max[k] - min[k];
            double h = initialSteps is not null ? initialSteps[k]
                : double.IsFinite(range) ? 1e-4 * Math.Max(Math.Abs(x[k]), 1e-3 * range) : 1e-3 * Math.Max(Math.Abs(x[k]), 1);
            for (int pass = 0, shrinks = 0; pass < 2; pass++)
            {
                double xk = x[k];
                bool up = xk + h <= max[k], down = xk - h >= min[k];
                if (up && down)
                {
                    x[k] = xk + h; Gradient(x, gp, 1e-2 * h);
                    x[k] = xk - h; Gradient(x, gm, 1e-2 * h);
                    x[k] = xk;
                    for (int j = 0; j < d; j++) hess[j, k] = (gp[j] - gm[j]) / (2 * h);
                }
                else
                {
                    double s = up ? 1 : -1;
                    if (!haveG0) { Gradient(x, g0, 1e-2 * h); haveG0 = true; }
                    x[k] = xk + s * h; Gradient(x, gp, 1e-2 * h);
                    x[k] = xk + 2 * s * h; Gradient(x, g2, 1e-2 * h);
                    x[k] = xk;
                    for (int j = 0; j < d; j++) hess[j, k] = s * (-3 * g0[j] + 4 * gp[j] - g2[j]) / (2 * h);
                }
                bool finite = true;
                for (int j = 0; j < d; j++) finite &= double.IsFinite(hess[j, k]);
                if (!finite && shrinks++ < 20) { h *= 0.25; pass--; continue; }
                double hkk = hess[k, k];
                if (pass == 1 || !(hkk < 0) || !double.IsFinite(hkk)) break;
                double next = 1e-3 / Math.Sqrt(-hkk);
                if (next > 0.3 * h && next < 3 * h) break; // the first step was already right
                h = Math.Min(next, 0.25 * range);
            }
        }
        for (int j = 0; j < d; j++)
            for (int k = 0; k < j; k++)
            {
                if (!active[j] || !active[k]) { hess[j, k] = hess[k, j] = 0; continue; }
                double v = 0.5 * (hess[j, k] + hess[k, j]);
                hess[j, k] = hess[k, j] = v;
            }
        for (int j = 0; j < d; j++)
            if (!active[j]) for (int k = 0; k < d; k++) hess[j, k] = hess[k, j] = 0;
        return (hess, evals);
    }

    private static void CentralGradient(ILogDensity f, double[] p, double[] into, double step, IReadOnlyList<double> min, IReadOnlyList<double> max)
    {
        for (int j = 0; j < p.Length; j++)
        {
            double pj = p[j], h = Math.Max(step, 1e-9 * Math.Max(Math.Abs(pj), 1e-3));
            double hi = Math.Min(pj + h, max[j]), lo = Math.Max(pj - h, min[j]);
            p[j] = hi; double fp = f.LogDensity(p);
            p[j] = lo; double fm = f.LogDensity(p);
            p[j] = pj;
            into[j] = (fp - fm) / (hi - lo);
        }
    }

    /// <summary>
    /// Analyses −H over the active parameters: definiteness by Cholesky (MathNet), the covariance (−H)⁻¹, the correlation
    /// matrix, the condition number of the unit-diagonal curvature matrix and, when −H is singular or indefinite, the
    /// degenerate direction named from the eigenvector of its smallest eigenvalue.
    /// </summary>
    public static HessianAnalysis Analyse(double[,] hessian, bool[] active, IReadOnlyList<string> names, IReadOnlyList<double>? theta = null)
    {
        ArgumentNullException.ThrowIfNull(hessian);
        int d = active.Length;
        var idx = Enumerable.Range(0, d).Where(j => active[j]).ToArray();
        var cov = new double[d, d];
        var corr = new double[d, d];
        if (idx.Length == 0) return new HessianAnalysis(cov, corr, 1, 1, null);
        int m = idx.Length;
        var M = Matrix<double>.Build.Dense(m, m, (a, b) => -hessian[idx[a], idx[b]]);
        for (int a = 0; a < m; a++)
            if (!(M[a, a] > 0) || !double.IsFinite(M[a, a]))
                return new HessianAnalysis(null, null, double.PositiveInfinity, double.NaN,
                    $"{names[idx[a]]} is unconstrained: the log-likelihood has no negative curvature along it at the maximum");
        var S = Matrix<double>.Build.Dense(m, m, (a, b) => M[a, b] / Math.Sqrt(M[a, a] * M[b, b]));
        var evd = S.Evd(Symmetricity.Symmetric);
        var ev = evd.EigenValues.Select(e => e.Real).ToArray();
        int iMin = Array.IndexOf(ev, ev.Min());
        double lmin = ev[iMin], lmax = ev.Max();
        double condition = lmin > 0 ? lmax / lmin : double.PositiveInfinity;
        bool cholesky = true;
        Matrix<double>? inv = null;
        try { inv = M.Cholesky().Solve(Matrix<double>.Build.DenseIdentity(m)); }
        catch (ArgumentException) { cholesky = false; }
        if (!cholesky || lmin < DegenerateScaledEigenvalue || inv is null)
        {
            var v = evd.EigenVectors.Column(iMin);
            return new HessianAnalysis(null, null, condition, lmin, DescribeDirection(v, idx, M, names, theta, cholesky));
        }
        for (int a = 0; a < m; a++)
            for (int b = 0; b < m; b++) cov[idx[a], idx[b]] = inv[a, b];
        for (int a = 0; a < m; a++)
            for (int b = 0; b < m; b++) corr[idx[a], idx[b]] = inv[a, b] / Math.Sqrt(inv[a, a] * inv[b, b]);
        return new HessianAnalysis(cov, corr, condition, lmin, null);
    }

    private static string DescribeDirection(Vector<double> v, int[] idx, Matrix<double> M, IReadOnlyList<string> names, IReadOnlyList<double>? theta, bool cholesky)
    {
        var inv = CultureInfo.InvariantCulture;
        double big = v.AbsoluteMaximum();
        var parts = Enumerable.Range(0, v.Count).Where(a => Math.Abs(v[a]) >= 0.2 * big).OrderByDescending(a => Math.Abs(v[a])).ToArray();
        string kind = cholesky ? "nearly singular" : "not positive definite";
        string dir = string.Join(", ", parts.Select(a => $"{names[idx[a]]} {v[a].ToString("+0.00;-0.00", inv)}"));
        if (parts.Length == 1)
            return $"the curvature matrix is {kind}: {names[idx[parts[0]]]} is unconstrained (flat direction: {dir}, unit-curvature coordinates)";
        string text = $"the curvature matrix is {kind}: flat direction {dir} (unit-curvature coordinates)";
        if (parts.Length == 2)
        {
            int a = parts[0], b = parts[1];
            string na = names[idx[a]], nb = names[idx[b]];
            // Physical direction δθ = v/√M_jj; in logarithms δθ/θ decides between a product and a ratio.
            double da = v[a] / Math.Sqrt(M[a, a]), db = v[b] / Math.Sqrt(M[b, b]);
            text += $": {na} and {nb} move together" + (Math.Sign(da) == Math.Sign(db) ? "" : " in opposite senses");
            if (theta is not null && theta[idx[a]] > 0 && theta[idx[b]] > 0)
            {
                double la = da / theta[idx[a]], lb = db / theta[idx[b]];
                if (Math.Abs(la + lb) < 0.1 * (Math.Abs(la) + Math.Abs(lb))) text += $": only {na}·{nb} is constrained";
                else if (Math.Abs(la - lb) < 0.1 * (Math.Abs(la) + Math.Abs(lb))) text += $": only {na}/{nb} is constrained";
                else text += ": only one combination of them is constrained";
            }
            else text += ": only one combination of them is constrained";
        }
        return text;
    }
}

/// <summary>What the Hessian at a maximum says about the parameters.</summary>
/// <param name="Covariance">(−H)⁻¹ over the active parameters (zeros elsewhere), or null when −H is singular or not positive definite.</param>
/// <param name="Correlation">The correlation matrix of <paramref name="Covariance"/>, or null.</param>
/// <param name="ConditionNumber">Largest over smallest eigenvalue of the unit-diagonal curvature matrix (∞ when not positive).</param>
/// <param name="SmallestScaledEigenvalue">Smallest eigenvalue of the unit-diagonal curvature matrix.</param>
/// <param name="Degeneracy">When <paramref name="Covariance"/> is null: the degenerate direction in words.</param>
public sealed record HessianAnalysis(double[,]? Covariance, double[,]? Correlation, double ConditionNumber, double SmallestScaledEigenvalue, string? Degeneracy);

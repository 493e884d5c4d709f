namespace SizeTest.Inference;

/// <summary>
/// Bounded limited-memory quasi-Newton minimisation of a smooth function on a box (L-BFGS-B in the projected form):
/// each iteration fixes the variables that sit on a bound with the gradient pushing outward (the binding set), takes the
/// L-BFGS direction (two-loop recursion over the last <c>m</c> curvature pairs, Nocedal 1980; Nocedal &amp; Wright 2006
/// Alg. 7.4) on the others, and searches along the projected path x(α) = P[x + αd] with an Armijo backtracking rule
/// (sufficient decrease c₁ = 10⁻⁴ measured along the projected step; Bertsekas 1982, "projected Newton methods";
/// Kim, Sra &amp; Dhillon 2010). Curvature pairs with sᵀy ≤ 10⁻¹⁰|s||y| are skipped, so the inverse-Hessian model stays
/// positive definite.
/// </summary>
/// <remarks>
/// Stopping: <see cref="OptimizerExit.Converged"/> when the quasi-Newton decrement −gᵀd of the projected gradient
/// (≈ twice the predicted remaining decrease) is below <c>max(decrementTolerance, 10⁻¹²|f|)</c> (the rounding level of a sum of many terms);
/// <see cref="OptimizerExit.NoFurtherProgress"/> when |Δf| ≤ 10⁻¹⁴ max(1, |f|) three times running.
/// </remarks>
public static class ProjectedLbfgs
{
    /// <summary>Result of one run.</summary>
    /// <param name="X">Best point (inside the box).</param>
    /// <param name="Value">f at <paramref name="X"/>.</param>
    /// <param name="Gradient">∇f at <paramref name="X"/>.</param>
    /// <param name="Exit">Why it stopped.</param>
    /// <param name="Iterations">Iterations taken.</param>
    /// <param name="Evaluations">Function-and-gradient evaluations.</param>
    public sealed record Result(double[] X, double Value, double[] Gradient, OptimizerExit Exit, int Iterations, int Evaluations);

    /// <summary>
    /// Minimises f from <paramref name="x0"/> (clamped into the box). <paramref name="f"/> returns f(x) and writes ∇f(x);
    /// it may return +∞ (or NaN) where f is undefined — such points are rejected by the line search.
    /// </summary>
    /// <param name="f">f(x), writing ∇f(x) into the second argument.</param>
    /// <param name="x0">Start.</param>
    /// <param name="lower">Lower bounds.</param>
    /// <param name="upper">Upper bounds.</param>
    /// <param name="maxIterations">Iteration cap.</param>
    /// <param name="decrementTolerance">Stopping threshold of the quasi-Newton decrement.</param>
    /// <param name="memory">Curvature pairs kept.</param>
    /// <param name="initialInverseHessian">Optional dense H₀ (an inverse-Hessian estimate at the start, e.g. the inverse of a
    /// finite-difference Hessian): used instead of the scaled identity in the two-loop recursion, so a good estimate gives
    /// Newton-like steps from the first iteration.</param>
    public static Result Minimize(Func<double[], double[], double> f, double[] x0, double[] lower, double[] upper,
        int maxIterations = 500, double decrementTolerance = 1e-9, int memory = 10, double[,]? initialInverseHessian = null)
    {
        int d = x0.Length, evals = 0;
        var x = new double[d];
        for (int j = 0; j < d; j++) x[j] = Math.Clamp(x0[j], lower[j], upper[j]);
        var g = new double[d];
        double fx = f(x, g); evals++;
        if (!double.IsFinite(fx)) return new Result(x, fx, g, OptimizerExit.NotFinite, 0, evals);
        var sList = new List<double[]>(); var yList = new List<double[]>(); var rhoList = new List<double>();
        var dir = new double[d]; var xn = new double[d]; var gn = new double[d];
        var bind = new bool[d];
        int flat = 0, iter = 0;
        for (; iter < maxIterations; iter++)
        {
            for (int j = 0; j < d; j++)
            {
                double room = 1e-12 * Math.Max(1, upper[j] - lower[j]);
                bind[j] = (x[j] <= lower[j] + room && g[j] > 0) || (x[j] >= upper[j] - room && g[j] < 0);
            }
            Direction(g, bind, sList, yList, rhoList, dir, initialInverseHessian);
            double slope = 0;
            for (int j = 0; j < d; j++) slope += g[j] * dir[j];
            if (!(slope < 0))
            {
                sList.Clear(); yList.Clear(); rhoList.Clear();
                Direction(g, bind, sList, yList, rhoList, dir, initialInverseHessian);
                slope = 0;
                for (int j = 0; j < d; j++) slope += g[j] * dir[j];
            }
            if (-slope <= Math.Max(decrementTolerance, 1e-12 * Math.Abs(fx)) && sList.Count > 0 && iter > 0)
                return new Result(x, fx, g, OptimizerExit.Converged, iter, evals);
            if (!(slope < 0) && initialInverseHessian is not null)
            {
                // The dense estimate does not give a descent direction here: drop it for the rest of the run.
                initialInverseHessian = null;
                Direction(g, bind, sList, yList, rhoList, dir, null);
                slope = 0;
                for (int j = 0; j < d; j++) slope += g[j] * dir[j];
            }
            if (-slope <= Math.Max(decrementTolerance, 1e-12 * Math.Abs(fx)) && initialInverseHessian is not null && iter > 0)
                return new Result(x, fx, g, OptimizerExit.Converged, iter, evals);
            if (slope == 0 && iter > 0) return new Result(x, fx, g, OptimizerExit.Converged, iter, evals);
            // First step without curvature memory: limit the largest coordinate move to 10% of max(|x_j|, 1e-3·range).
            double alpha = 1;
            if (sList.Count == 0 && initialInverseHessian is null)
            {
                double worst = 0;
                for (int j = 0; j < d; j++)
                    worst = Math.Max(worst, Math.Abs(dir[j]) / Math.Max(0.1 * Math.Max(Math.Abs(x[j]), 1e-3 * (upper[j] - lower[j])), 1e-12));
                if (worst > 1) alpha = 1 / worst;
            }
            double fn = double.NaN;
            bool accepted = false;
            for (int bt = 0; bt < 60; bt++)
            {
                double decrease = 0;
                for (int j = 0; j < d; j++)
                {
                    xn[j] = bind[j] ? x[j] : Math.Clamp(x[j] + alpha * dir[j], lower[j], upper[j]);
                    decrease += g[j] * (xn[j] - x[j]);
                }
                if (-decrease <= 1e-14 * Math.Max(1, Math.Abs(fx))) break; // the step's predicted gain is below rounding
                fn = f(xn, gn); evals++;
                if (double.IsFinite(fn) && fn <= fx + 1e-4 * decrease) { accepted = true; break; }
                alpha *= bt < 3 ? 0.5 : 0.2;
            }
            if (!accepted && -slope <= 1e-9 * Math.Max(1, Math.Abs(fx)))
                return new Result(x, fx, g, OptimizerExit.NoFurtherProgress, iter, evals);
            if (!accepted)
            {
                if (sList.Count > 0) { sList.Clear(); yList.Clear(); rhoList.Clear(); continue; }
                if (initialInverseHessian is not null)
                {
                    // The dense estimate (made at another point, e.g. a profile refit's neighbour) proposed a step no
                    // backtracking could make acceptable: continue from the scaled identity with its first-step limit.
                    initialInverseHessian = null;
                    continue;
                }
                return new Result(x, fx, g, OptimizerExit.LineSearchFailed, iter, evals);
            }
            var s = new double[d]; var y = new double[d];
            double sy = 0, ss = 0, yy = 0;
            for (int j = 0; j < d; j++)
            {
                s[j] = xn[j] - x[j]; y[j] = gn[j] - g[j];
                sy += s[j] * y[j]; ss += s[j] * s[j]; yy += y[j] * y[j];
            }
            if (sy > 1e-10 * Math.Sqrt(ss * yy))
            {
                if (sList.Count == memory) { sList.RemoveAt(0); yList.RemoveAt(0); rhoList.RemoveAt(0); }
                sList.Add(s); yList.Add(y); rhoList.Add(1 / sy);
            }
            double change = fx - fn;
            Array.Copy(xn, x, d); Array.Copy(gn, g, d);
            fx = fn;
            flat = change <= 1e-14 * Math.Max(1, Math.Abs(fx)) ? flat + 1 : 0;
            if (flat >= 3) return new Result(x, fx, g, OptimizerExit.NoFurtherProgress, iter + 1, evals);
        }
        return new Result(x, fx, g, OptimizerExit.IterationLimit, iter, evals);
    }

    // d = −H·g on the non-binding coordinates (binding ones 0), H the L-BFGS inverse-Hessian model with
    // H₀ = (sᵀy/yᵀy) I (Nocedal & Wright 2006 eq. 7.20), or the identity without memory.
    private static void Direction(double[] g, bool[] bind, List<double[]> sList, List<double[]> yList, List<double> rhoList, double[] dir, double[,]? h0)
    {
        int d = g.Length, m = sList.Count;
        var q = new double[d];
        for (int j = 0; j < d; j++) q[j] = bind[j] ? 0 : g[j];
        var alpha = new double[m];
        for (int i = m - 1; i >= 0; i--)
        {
            double a = 0;
            for (int j = 0; j < d; j++) if (!bind[j]) a += sList[i][j] * q[j];
            a *= rhoList[i];
            alpha[i] = a;
            for (int j = 0; j < d; j++) if (!bind[j]) q[j] -= a * yList[i][j];
        }
        double gamma = 1;
        if (m > 0)
        {
            double sy = 0, yy = 0;
            for (int j = 0; j < d; j++) { sy += sList[m - 1][j] * yList[m - 1][j]; yy += yList[m - 1][j] * yList[m - 1][j]; }
            if (yy > 0) gamma = sy / yy;
        }
        if (h0 is not null)
        {
            var r = new double[d];
            for (int j = 0; j < d; j++)
            {
                if (bind[j]) continue;
                double v = 0;
                for (int k = 0; k < d; k++) if (!bind[k]) v += h0[j, k] * q[k];
                r[j] = v;
            }
            Array.Copy(r, q, d);
        }
        else
            for (int j = 0; j < d; j++) q[j] *= gamma;
        for (int i = 0; i < m; i++)
        {
            double b = 0;
            for (int j = 0; j < d; j++) if (!bind[j]) b += yList[i][j] * q[j];
            b *= rhoList[i];
            for (int j = 0; j < d; j++) if (!bind[j]) q[j] += sList[i][j] * (alpha[i] - b);
        }
        for (int j = 0; j < d; j++) dir[j] = bind[j] ? 0 : -q[j];
    }
}

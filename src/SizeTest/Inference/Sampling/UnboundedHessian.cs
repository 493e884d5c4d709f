using System.Globalization;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// Hessian of a log density by central finite differences, with the step of every coordinate
/// chosen from the function itself: h_i is scaled until the second difference
/// f(x + h e_i) + f(x − h e_i) − 2 f(x) lies between 10⁻⁴ and 1 (in log-density units), so the
/// step is neither lost in rounding nor so large that higher-order terms dominate, and is
/// reduced whenever a stencil point falls outside the support (−∞). Diagonal terms use the
/// three-point formula, mixed terms the four-point formula
/// [f(+,+) − f(+,−) − f(−,+) + f(−,−)] / (4 h_i h_j) (Press et al. 2007, Numerical Recipes 3rd ed. §5.7),
/// each improved by one Richardson extrapolation D = (4 D(h/2) − D(h))/3, which removes the
/// O(h²) error term (Press et al. 2007 §5.7). All are exact for a quadratic function.
/// </summary>
public static class UnboundedHessian
{
    /// <summary>
    /// Computes the Hessian of <paramref name="f"/> at <paramref name="x"/>.
    /// </summary>
    /// <param name="f">The log density (thread safety not needed: evaluated sequentially).</param>
    /// <param name="x">The point, usually a mode.</param>
    /// <param name="hessian">The symmetric d×d Hessian on success.</param>
    /// <param name="failure">Why it failed (non-finite value at <paramref name="x"/>, no usable step).</param>
    /// <param name="initialSteps">Starting step per coordinate; null for 10⁻³ · max(|x_i|, 1).</param>
    /// <returns>True on success.</returns>
    public static bool TryCompute(ILogDensity f, ReadOnlySpan<double> x, out double[,] hessian, out string failure, ReadOnlySpan<double> initialSteps = default)
    {
        ArgumentNullException.ThrowIfNull(f);
        int d = x.Length;
        if (f.Dimension != d) throw new ArgumentException($"The point has {d} coordinates but the density {f.Dimension}.", nameof(x));
        if (!initialSteps.IsEmpty && initialSteps.Length != d) throw new ArgumentException("One initial step per coordinate is needed.", nameof(initialSteps));
        hessian = new double[d, d];
        failure = "";
        var inv = CultureInfo.InvariantCulture;
        var p = x.ToArray();
        double f0 = f.LogDensity(p);
        if (!double.IsFinite(f0))
        {
            failure = string.Create(inv, $"the log density at the point is {f0} (not finite)");
            return false;
        }
        var h = new double[d];
        for (int i = 0; i < d; i++)
        {
            double step = initialSteps.IsEmpty ? 1e-3 * Math.Max(Math.Abs(x[i]), 1.0) : initialSteps[i];
            if (!(step > 0) || !double.IsFinite(step)) throw new ArgumentException($"Initial step {i} must be positive.", nameof(initialSteps));
            bool found = false;
            bool grew = false, shrank = false;
            for (int attempt = 0; attempt < 80; attempt++)
            {
                double delta = Eval(f, p, i, step, -1, 0, x) + Eval(f, p, i, -step, -1, 0, x) - 2.0 * f0;
                double half = Eval(f, p, i, step / 2, -1, 0, x) + Eval(f, p, i, -step / 2, -1, 0, x) - 2.0 * f0;
                if (!double.IsFinite(delta) || !double.IsFinite(half)) { step *= 0.25; shrank = true; continue; }
                double a = Math.Abs(delta);
                if (a < 1e-5 && !shrank && step < 1e150) { step *= 4.0; grew = true; continue; }
                if (a > 1e-1 && !grew) { step *= 0.25; shrank = true; continue; }
                double coarse = delta / (step * step), fine = half / (step * step / 4);
                hessian[i, i] = (4.0 * fine - coarse) / 3.0;
                found = true;
                break;
            }
            if (!found)
            {
                failure = string.Create(inv, $"no usable finite-difference step for parameter {i} (the log density is not finite or not smooth near the point)");
                return false;
            }
            h[i] = step;
        }
        for (int i = 0; i < d; i++)
            for (int j = 0; j < i; j++)
            {
                double hi = h[i], hj = h[j];
                double value = double.NaN;
                for (int attempt = 0; attempt < 20; attempt++)
                {
                    double coarse = Mixed(f, p, x, i, hi, j, hj), fine = Mixed(f, p, x, i, hi / 2, j, hj / 2);
                    value = (4.0 * fine - coarse) / 3.0;
                    if (double.IsFinite(value)) break;
                    hi *= 0.5;
                    hj *= 0.5;
                }
                if (!double.IsFinite(value))
                {
                    failure = $"the mixed derivative of parameters {j} and {i} could not be computed (the log density is not finite near the point)";
                    return false;
                }
                hessian[i, j] = value;
                hessian[j, i] = value;
            }
        return true;
    }

    private static double Mixed(ILogDensity f, double[] p, ReadOnlySpan<double> x, int i, double hi, int j, double hj) =>
        (Eval(f, p, i, hi, j, hj, x) - Eval(f, p, i, hi, j, -hj, x) - Eval(f, p, i, -hi, j, hj, x) + Eval(f, p, i, -hi, j, -hj, x)) / (4.0 * hi * hj);

    private static double Eval(ILogDensity f, double[] p, int i, double hi, int j, double hj, ReadOnlySpan<double> x)
    {
        p[i] = x[i] + hi;
        if (j >= 0) p[j] = x[j] + hj;
        double v = f.LogDensity(p);
        p[i] = x[i];
        if (j >= 0) p[j] = x[j];
        return v;
    }
}

using System.Globalization;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// The Hessian of a log density without bounds (Laplace evidence): a thin entry to the one Hessian,
/// <see cref="NumericalHessian"/> (central differences of the gradient — analytic when the density has one, else central
/// differences of values — symmetrised; steps shrink where the stencil leaves the support).
/// </summary>
public static class LogDensityHessian
{
    /// <summary>Computes the Hessian of <paramref name="f"/> at <paramref name="x"/>.</summary>
    /// <param name="f">The log density.</param>
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
        for (int i = 0; i < initialSteps.Length; i++)
            if (!(initialSteps[i] > 0) || !double.IsFinite(initialSteps[i])) throw new ArgumentException($"Initial step {i} must be positive.", nameof(initialSteps));
        failure = "";
        double f0 = f.LogDensity(x);
        if (!double.IsFinite(f0))
        {
            hessian = new double[d, d];
            failure = string.Create(CultureInfo.InvariantCulture, $"the log density at the point is {f0} (not finite)");
            return false;
        }
        var inf = Enumerable.Repeat(double.PositiveInfinity, d).ToArray();
        var ninf = Enumerable.Repeat(double.NegativeInfinity, d).ToArray();
        var active = Enumerable.Repeat(true, d).ToArray();
        (hessian, _) = NumericalHessian.Compute(f, x, ninf, inf, active, initialSteps.IsEmpty ? null : initialSteps.ToArray());
        for (int i = 0; i < d; i++)
            for (int j = 0; j < d; j++)
                if (!double.IsFinite(hessian[i, j]))
                {
                    failure = $"no usable finite-difference step for parameters {i} and {j} (the log density is not finite or not smooth near the point)";
                    return false;
                }
        return true;
    }
}

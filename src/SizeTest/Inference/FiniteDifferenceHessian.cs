namespace SizeTest.Inference;

/// <summary>
/// Kept for existing callers: forwards to the one Hessian, <see cref="NumericalHessian"/> (central differences of the gradient,
/// Cholesky for definiteness).
/// </summary>
public static class FiniteDifferenceHessian
{
    /// <summary>See <see cref="NumericalHessian.Compute"/>.</summary>
    public static (double[,] Hessian, int Evaluations) Compute(ILogDensity f, ReadOnlySpan<double> theta, IReadOnlyList<double> min, IReadOnlyList<double> max, bool[] active) =>
        NumericalHessian.Compute(f, theta, min, max, active);

    /// <summary>(−H)⁻¹ over the active parameters, or null when −H is singular or not positive definite (see <see cref="NumericalHessian.Analyse"/>).</summary>
    public static double[,]? Covariance(double[,] hessian, bool[] active) =>
        NumericalHessian.Analyse(hessian, active, Enumerable.Range(0, active.Length).Select(j => $"parameter {j}").ToArray()).Covariance;
}

using System.Globalization;
using MathNet.Numerics.LinearAlgebra;
using SizeTest.Foundation.Errors;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// The Laplace approximation to the evidence (Kass &amp; Raftery 1995, JASA 90, 773, eq. 5;
/// MacKay 2003, Information Theory, Inference and Learning Algorithms, ch. 27):
/// ln Z ≈ ln L(θ̂) + ln π(θ̂) + (d/2) ln 2π + ½ ln|Σ|, where θ̂ is the posterior mode and
/// Σ = (−∇∇ ln[L π])⁻¹ at θ̂. Exact for a Gaussian likelihood under a uniform prior that
/// contains all of it; too large when the prior truncates the posterior (a warning says so).
/// </summary>
public static class LaplaceEvidence
{
    /// <summary>Mode closer than this many standard deviations to a prior bound triggers a warning.</summary>
    public const double BoundWarningSigmas = 3.0;

    /// <summary>ln Z from the values at the mode and the posterior covariance.</summary>
    /// <param name="logLikelihoodAtMode">ln L(θ̂).</param>
    /// <param name="logPriorAtMode">ln π(θ̂) (normalised prior density).</param>
    /// <param name="covariance">Posterior covariance Σ (symmetric positive definite).</param>
    /// <exception cref="AnalysisException">When Σ is not positive definite or the inputs are not finite.</exception>
    public static LaplaceResult Compute(double logLikelihoodAtMode, double logPriorAtMode, double[,] covariance)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        if (!double.IsFinite(logLikelihoodAtMode) || !double.IsFinite(logPriorAtMode))
            throw new AnalysisException("The Laplace evidence needs a finite log-likelihood and log prior at the mode.");
        int d = covariance.GetLength(0);
        if (covariance.GetLength(1) != d) throw new ArgumentException("The covariance must be square.", nameof(covariance));
        var cov = Matrix<double>.Build.DenseOfArray(covariance);
        double logDet = LogDeterminantSpd(cov, "covariance");
        double lnZ = logLikelihoodAtMode + logPriorAtMode + 0.5 * d * Math.Log(2 * Math.PI) + 0.5 * logDet;
        return new LaplaceResult(lnZ, logLikelihoodAtMode, logPriorAtMode, (double[,])covariance.Clone(), logDet, []);
    }

    /// <summary>ln Z with the caller's covariance (e.g. from the fitter's Hessian) and priors evaluated here.</summary>
    /// <param name="logLikelihood">ln L(θ).</param>
    /// <param name="priors">One prior per parameter.</param>
    /// <param name="mode">Posterior mode θ̂ (for uniform priors the maximum-likelihood point).</param>
    /// <param name="covariance">Posterior covariance at the mode.</param>
    public static LaplaceResult Compute(ILogDensity logLikelihood, IReadOnlyList<ParameterPrior> priors, ReadOnlySpan<double> mode, double[,] covariance)
    {
        CheckShapes(logLikelihood, priors, mode);
        double lnL = logLikelihood.LogDensity(mode);
        double lnPi = LogPrior(priors, mode);
        var result = Compute(lnL, lnPi, covariance);
        return result with { Warnings = BoundWarnings(priors, mode, covariance) };
    }

    /// <summary>
    /// ln Z with the covariance from the numerical Hessian of ln L + Σ ln π_i at <paramref name="mode"/>
    /// (<see cref="LogDensityHessian"/>).
    /// </summary>
    /// <param name="logLikelihood">ln L(θ).</param>
    /// <param name="priors">One prior per parameter.</param>
    /// <param name="mode">Posterior mode θ̂.</param>
    /// <param name="initialSteps">Starting finite-difference steps (e.g. 10⁻³ × a parameter's scale); null for automatic.</param>
    /// <exception cref="AnalysisException">When the Hessian cannot be computed or the mode is not a maximum.</exception>
    public static LaplaceResult Compute(ILogDensity logLikelihood, IReadOnlyList<ParameterPrior> priors, ReadOnlySpan<double> mode, double[]? initialSteps = null)
    {
        if (!TryCompute(logLikelihood, priors, mode, out var result, out var failure, initialSteps))
            throw new AnalysisException($"The Laplace evidence could not be computed: {failure}.");
        return result;
    }

    /// <summary>Like <see cref="Compute(ILogDensity, IReadOnlyList{ParameterPrior}, ReadOnlySpan{double}, double[])"/> but returns false with a reason instead of throwing.</summary>
    public static bool TryCompute(ILogDensity logLikelihood, IReadOnlyList<ParameterPrior> priors, ReadOnlySpan<double> mode,
                                  out LaplaceResult result, out string failure, double[]? initialSteps = null)
    {
        CheckShapes(logLikelihood, priors, mode);
        result = null!;
        var posterior = new LogPosterior(logLikelihood, priors);
        if (!LogDensityHessian.TryCompute(posterior, mode, out var hessian, out failure, initialSteps))
            return false;
        int d = mode.Length;
        var negH = Matrix<double>.Build.DenseOfArray(hessian).Negate();
        if (!TryLogDeterminantSpd(negH, out double logDetNegH))
        {
            failure = "the negative Hessian of the log posterior is not positive definite (the point is not a maximum)";
            return false;
        }
        var cov = negH.Inverse();
        cov = (cov + cov.Transpose()) * 0.5;
        double lnL = logLikelihood.LogDensity(mode);
        double lnPi = LogPrior(priors, mode);
        if (!double.IsFinite(lnL) || !double.IsFinite(lnPi))
        {
            failure = "the log-likelihood or log prior at the mode is not finite";
            return false;
        }
        double lnZ = lnL + lnPi + 0.5 * d * Math.Log(2 * Math.PI) - 0.5 * logDetNegH;
        var covArray = cov.ToArray();
        result = new LaplaceResult(lnZ, lnL, lnPi, covArray, -logDetNegH, BoundWarnings(priors, mode, covArray));
        failure = "";
        return true;
    }

    private static double LogPrior(IReadOnlyList<ParameterPrior> priors, ReadOnlySpan<double> theta)
    {
        double s = 0;
        for (int i = 0; i < priors.Count; i++) s += priors[i].LogDensity(theta[i]);
        return s;
    }

    private static void CheckShapes(ILogDensity logLikelihood, IReadOnlyList<ParameterPrior> priors, ReadOnlySpan<double> mode)
    {
        ArgumentNullException.ThrowIfNull(logLikelihood);
        ArgumentNullException.ThrowIfNull(priors);
        if (priors.Count != logLikelihood.Dimension || mode.Length != logLikelihood.Dimension)
            throw new ArgumentException($"The likelihood has {logLikelihood.Dimension} parameters; got {priors.Count} priors and a mode of length {mode.Length}.");
    }

    private static double LogDeterminantSpd(Matrix<double> m, string what) =>
        TryLogDeterminantSpd(m, out double logDet)
            ? logDet
            : throw new AnalysisException($"The {what} given to the Laplace evidence is not positive definite.");

    /// <summary>ln|m| by Cholesky factorisation; false when m is not symmetric positive definite.</summary>
    private static bool TryLogDeterminantSpd(Matrix<double> m, out double logDet)
    {
        int d = m.RowCount;
        var l = new double[d, d];
        logDet = 0;
        for (int i = 0; i < d; i++)
            for (int j = 0; j <= i; j++)
            {
                if (!double.IsFinite(m[i, j]) || Math.Abs(m[i, j] - m[j, i]) > 1e-8 * (Math.Abs(m[i, j]) + Math.Abs(m[j, i]) + 1e-300)) return false;
                double s = m[i, j];
                for (int k = 0; k < j; k++) s -= l[i, k] * l[j, k];
                if (i == j)
                {
                    if (!(s > 0)) return false;
                    l[i, i] = Math.Sqrt(s);
                    logDet += 2.0 * Math.Log(l[i, i]);
                }
                else l[i, j] = s / l[j, j];
            }
        return true;
    }

    private static IReadOnlyList<string> BoundWarnings(IReadOnlyList<ParameterPrior> priors, ReadOnlySpan<double> mode, double[,] cov)
    {
        var warnings = new List<string>();
        for (int i = 0; i < priors.Count; i++)
        {
            double sd = Math.Sqrt(cov[i, i]);
            double distance = Math.Min(mode[i] - priors[i].Min, priors[i].Max - mode[i]) / sd;
            if (distance < BoundWarningSigmas)
                warnings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"parameter {i}: the mode is {distance:F2} σ from a prior bound, so the Laplace evidence overestimates Z (use nested sampling)"));
        }
        return warnings;
    }
}
